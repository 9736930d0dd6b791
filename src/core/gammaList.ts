import { inputProblem, type InputProblem } from './inputProblem';

/**
 * The problems of a list of hidden-bias values Γ (matched pairs and matched sets alike): at least one value, each
 * a finite number of 1 or more (Γ = 1 means no hidden bias). Fields `gammas` and `gammas[i]`.
 */
export function gammaListProblems(gammas: unknown): InputProblem[] {
  if (!Array.isArray(gammas) || gammas.length === 0) return [inputProblem('gammas', 'empty', 'give at least one Γ value, each 1 or more')];
  const problems: InputProblem[] = [];
  gammas.forEach((g, i) => {
    if (!(typeof g === 'number' && Number.isFinite(g))) {
      problems.push(inputProblem(`gammas[${i}]`, 'not-finite', 'must be a finite number, 1 or more', g));
    } else if (g < 1) {
      problems.push(inputProblem(`gammas[${i}]`, 'below-one', `must be 1 or more (Γ = 1 means no hidden bias), got ${g}`, g));
    }
  });
  return problems;
}
