import type { MethodModule } from './methodModule';
import { evalueMethod } from './evalue/method';
import { pairsMethod } from './pairs/method';
import { regressionMethod } from './regression/method';
import { setsMethod } from './sets/method';
import { weightingMethod } from './weighting/method';

/**
 * Every method Lurk offers, in the order of the page's tabs and `lurk --help`. The app's tabs, the command
 * line's commands, appraisal files, share links, the statement and the bottom line all iterate this list:
 * a new method is one folder under src/methods/ and one line here.
 */
export const METHODS: readonly MethodModule[] = Object.freeze([evalueMethod, pairsMethod, setsMethod, regressionMethod, weightingMethod] as unknown as MethodModule[]);

/** The method stored under `id` in appraisal files, or undefined. */
export function methodById(id: string): MethodModule | undefined {
  return METHODS.find((m) => m.id === id);
}

/** The method whose command is `name` (`lurk NAME`), or undefined. */
export function methodByCommand(name: string): MethodModule | undefined {
  return METHODS.find((m) => m.command.name === name);
}
