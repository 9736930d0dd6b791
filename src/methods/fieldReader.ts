import { inputProblem, type InputProblem } from '../core/inputProblem';
import { readTypedNumber, type NumberKind } from '../data/numberText';

/**
 * The one way every method's request reader turns typed text into values: numbers through the one number
 * reader (`readTypedNumber`), choices without regard to case, lists split on commas, semicolons or spaces.
 * Problems are collected by form field, with the same message on every surface.
 */
export interface FieldReader {
  readonly problems: InputProblem[];
  /** The number in `text`, or null when it is empty (the method decides whether it is required) or bad. */
  number(field: string, text: string, kind?: NumberKind): number | null;
  /** Like `number`, but an empty field is a problem too ("is required" + what is expected). */
  required(field: string, text: string, kind: NumberKind, what: string): number | null;
  /** A list of numbers ("1, 1.5, 2" or "1;1,5;2"), or null when empty; each item read as `kind`. */
  numberList(field: string, text: string, kind?: NumberKind): number[] | null;
  /** One of a few words, matched without regard to case and surrounding spaces; null when empty. */
  choice<T extends string>(field: string, text: string, choices: readonly T[]): T | null;
  /** Whether a problem is already recorded for the field (so rule checks do not repeat it). */
  has(field: string): boolean;
}

export function fieldReader(): FieldReader {
  const problems: InputProblem[] = [];
  const reader: FieldReader = {
    problems,
    number(field, text, kind = 'decimal') {
      const read = readTypedNumber(String(text ?? ''), kind);
      if (read.ok) return read.value;
      if (read.code !== 'required') problems.push(inputProblem(field, read.code, read.message, text));
      return null;
    },
    required(field, text, kind, what) {
      // Empty text and the missing-cell texts ("NA", "NaN", ".") are both missing.
      const read = readTypedNumber(String(text ?? ''), kind);
      if (!read.ok && read.code === 'required') {
        problems.push(inputProblem(field, 'required', `is required (${what})`));
        return null;
      }
      return reader.number(field, text, kind);
    },
    numberList(field, text, kind = 'decimal') {
      const trimmed = String(text ?? '').trim();
      if (trimmed === '') return null;
      // A list separator is ";" or whitespace, or "," when the list has no decimal commas to confuse it with.
      const items = /;/.test(trimmed) ? trimmed.split(/\s*;\s*/) : /\s/.test(trimmed) && !/,\s/.test(trimmed) ? trimmed.split(/\s+/) : trimmed.split(/\s*,\s*/);
      const values: number[] = [];
      for (const [i, item] of items.entries()) {
        const read = readTypedNumber(item, kind);
        if (!read.ok) {
          problems.push(inputProblem(field, read.code === 'required' ? 'not-a-number' : read.code, `item ${i + 1} ${read.code === 'required' ? 'is empty' : read.message}`, text));
          return null;
        }
        values.push(read.value);
      }
      return values;
    },
    choice<T extends string>(field: string, text: string, choices: readonly T[]): T | null {
      const wanted = String(text ?? '').trim().toLowerCase();
      if (wanted === '') return null;
      const found = choices.find((c) => c.toLowerCase() === wanted);
      if (found === undefined) problems.push(inputProblem(field, 'not-a-choice', `must be one of ${choices.join(', ')}, got "${String(text).trim()}"`, text));
      return found ?? null;
    },
    has(field) {
      return problems.some((p) => p.field === field);
    },
  };
  return reader;
}

/** The significance levels every method accepts: smaller ones are below what the tail computations resolve. */
export const ALPHA_RANGE = { low: 1e-12, high: 0.5 } as const;
/** The ratios (estimates, limits, targets) every method accepts: beyond them an E-value is not representable. */
export const RATIO_RANGE = { low: 1e-300, high: 1e300 } as const;

/**
 * Records a problem when a number that was read lies outside [low, high] and returns null then; `why` says
 * why the range is what it is (one short clause). An absent value (null/undefined) passes through.
 */
export function withinRange(reader: FieldReader, field: string, value: number | null | undefined, range: { low: number; high: number }, why: string): number | null {
  if (value === null || value === undefined) return null;
  if (value >= range.low && value <= range.high) return value;
  if (!reader.has(field)) reader.problems.push(inputProblem(field, 'outside-range', `must be between ${range.low} and ${range.high} (${why}), got ${value}`, value));
  return null;
}

/** {@link withinRange} for a significance level. */
export function alphaWithinRange(reader: FieldReader, field: string, value: number | null | undefined): number | null {
  return withinRange(reader, field, value, ALPHA_RANGE, 'a significance level above 0.5 rejects more often than not, and one below 1e-12 is beyond the precision of the tail computations');
}
