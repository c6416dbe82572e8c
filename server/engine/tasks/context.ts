import type { Tolerances } from '../defaults.ts';

/** What every task receives besides the model and its own settings. */
export interface TaskContext {
  /** Date.now() after which a task returns what it has with stop reason "time-limit". */
  deadline: number;
  tolerances: Tolerances;
}

export const pastDeadline = (ctx: TaskContext) => Date.now() > ctx.deadline;
