/**
 * The numerical engine: pure TypeScript, no I/O. One entry point for the HTTP API, the cells and
 * the command line. See server/engine/README.md.
 */
export { analyze, validateModel, type AnalyzeOptions } from './analyze.ts';
export { EngineRequestError, EngineUsageError } from './errors.ts';
export { ENGINE_VERSION } from './version.ts';
export { TOLERANCES, type Tolerances } from './defaults.ts';
export type * from '@shared/engine/contract.ts';
