/**
 * One problem with a user's input: which field, which rule, what was given.
 *
 * Every user-facing analysis validates its whole input first and reports every problem at once,
 * so a form can mark all bad fields and the command line can print `field: message`.
 * `code` is stable (tests and callers may switch on it); `message` is for people.
 */
export interface InputProblem {
  /** The input field, as named in the analysis' input object (e.g. `estimate`, `counts.a`, `gamma[2]`). */
  readonly field: string;
  /** A stable machine-readable rule name, e.g. `not-finite`, `not-positive`, `outside-interval`. */
  readonly code: string;
  /** One plain sentence naming the rule, without the field name (the caller prefixes it). */
  readonly message: string;
  /** The offending value as given (echoed back to the user). */
  readonly value?: unknown;
}

/** Thrown by an analysis when its input breaks a rule; carries every problem found. */
export class InputError extends Error {
  readonly problems: readonly InputProblem[];

  constructor(problems: readonly InputProblem[]) {
    super(problems.map((p) => `${p.field}: ${p.message}`).join('\n'));
    this.name = 'InputError';
    this.problems = Object.freeze([...problems]);
  }
}

/** Builds a frozen problem record. */
export function inputProblem(field: string, code: string, message: string, value?: unknown): InputProblem {
  return Object.freeze(value === undefined ? { field, code, message } : { field, code, message, value });
}

/** Throws an InputError when the list is not empty; otherwise does nothing. */
export function throwIfProblems(problems: readonly InputProblem[]): void {
  if (problems.length > 0) throw new InputError(problems);
}
