import type { InputProblem } from '../core/inputProblem';

/**
 * The problems a form shows: a missing required field only once the user has started filling the form in
 * (an empty form is not an error), every other problem at once. Order is kept.
 */
export function shownProblems(problems: readonly InputProblem[], started: boolean): InputProblem[] {
  return problems.filter((p) => started || p.code !== 'required');
}
