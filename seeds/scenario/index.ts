import { geneSwitchScenario } from './gene-switch.ts';
import { shallowLakeScenario } from './shallow-lake.ts';
import { stirredTankScenario } from './stirred-tank.ts';
import type { ScenarioNotebook } from './types.ts';

/** The demo research record, one module per notebook. Fresh cell ids on every call. */
export const DEMO_SCENARIOS = (): ScenarioNotebook[] => [
  stirredTankScenario(),
  shallowLakeScenario(),
  geneSwitchScenario(),
];
