import { describe, expect, it } from 'vitest';
import { inputProblem } from '../../src/core/inputProblem';
import { shownProblems } from '../../src/format/shownProblems';

// The project's form policy (DEVELOPERS.md, calculator elements): an untouched form shows no "required" errors.
describe('shownProblems', () => {
  const problems = Object.freeze([
    inputProblem('estimate', 'required', 'is required', ''),
    inputProblem('lower', 'not-a-number', 'must be a number', 'x'),
    inputProblem('upper', 'required', 'is required', ''),
  ]);

  it('hides only the missing required fields before the user has started, keeping order', () => {
    expect(shownProblems(problems, false).map((p) => p.field)).toEqual(['lower']);
  });

  it('shows every problem, in order, once the user has started', () => {
    expect(shownProblems(problems, true).map((p) => p.field)).toEqual(['estimate', 'lower', 'upper']);
  });

  it('does not change its input', () => {
    expect(shownProblems(problems, false)).not.toBe(problems);
    expect(problems).toHaveLength(3);
  });
});
