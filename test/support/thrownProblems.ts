import { InputError, type InputProblem } from '../../src/core/inputProblem';

/** The problems of the InputError that `run` throws; anything else thrown is re-thrown, and not throwing fails. */
export function problemsOf(run: () => unknown): InputProblem[] {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return [...error.problems];
    throw error;
  }
  throw new Error('expected an InputError');
}
