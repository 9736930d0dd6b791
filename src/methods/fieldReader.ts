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
      if (String(text ?? '').trim() === '') {
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
