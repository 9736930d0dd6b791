import { formatNumber } from './formatNumber';
import { unitsSuffix, type StudyLabels } from './studyLabels';

/**
 * Γ for people: rounded *down* to 3 decimals, so that the printed tipping point still has its p-value bound
 * at or below α (rounding up could print a Γ at which the finding is no longer significant).
 */
export function formatGamma(gamma: number | null | undefined): string {
  if (gamma === null || gamma === undefined || !Number.isFinite(gamma)) return 'not available';
  const floored = Math.floor(gamma * 1000 + 1e-9) / 1000;
  return floored >= 1e6 ? formatNumber(floored, { significant: 4 }) : floored.toFixed(3);
}

/** Γ values of the table: as given (they are round, e.g. 1.25), never NaN/Infinity. */
export function formatGammaValue(gamma: number): string {
  return formatAsTyped(gamma);
}

/** A number typed by a person (α, Γ, a level) as they would write it: 0.05, 1.25, 95. */
export function formatAsTyped(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return 'not available';
  const abs = Math.abs(x);
  if (abs !== 0 && (abs >= 1e9 || abs < 1e-6)) return formatNumber(x, { significant: 6 });
  return String(Number(x.toPrecision(6)));
}

/** An estimate or interval limit; an infinite limit reads "unbounded". */
export function formatEffect(x: number | null | undefined, study?: Partial<StudyLabels>): string {
  if (x === Infinity || x === -Infinity) return 'unbounded';
  return formatNumber(x, { significant: 3 }) + (x === null || x === undefined || Number.isNaN(x) ? '' : unitsSuffix(study));
}
