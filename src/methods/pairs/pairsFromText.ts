import { InputError, inputProblem } from '../../core/inputProblem';
import type { PairsData } from '../../core/pairsAnalysis';
import { isMissingCell } from '../../data/missingCell';
import { parseNumberText } from '../../data/numberText';
import { fieldReader } from '../fieldReader';
import type { PairsRead } from './pairsFromCsv';

/**
 * Reads numbers pasted into a box: one number per line (treated − control differences), or two per line
 * (treated outcome, control outcome). Columns are separated by tabs, semicolons or spaces — then a comma is a
 * decimal comma ("1,5") — or, when a line has none of those, by commas. An optional first line of words is a
 * header. Lines with a missing value (NA, ".", empty field) are dropped and counted; blank lines are skipped.
 *
 * @param field the input field named in messages (default `pasted`)
 * @throws InputError naming the line and the text when a value is not a number or lines disagree on how
 *   many numbers they hold (unequal columns)
 */
export function pairsFromPastedText(text: string, field = 'pasted'): PairsRead {
  const lines = text.replace(/^\ufeff/, '').split(/\r\n|\r|\n/);
  const usesOtherSeparators = /[\t;]|\S[ \u00a0]+\S/.test(lines.filter((l) => l.trim() !== '').join('\n'));
  const split = (line: string): string[] => {
    const trimmed = line.trim();
    if (usesOtherSeparators) return trimmed.split(/\s*[\t;]\s*|[ \u00a0]+/);
    return trimmed.split(/\s*,\s*/);
  };
  const decimalComma = usesOtherSeparators;
  let width = 0;
  let columns: string[] = [];
  const first: number[] = [];
  const second: number[] = [];
  let rowsRead = 0;
  let dropped = 0;
  let firstDataLine = true;
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i];
    if (line.trim() === '') continue;
    const cells = split(line);
    if (firstDataLine) {
      firstDataLine = false;
      // A header: no cell of the first line is a number or a missing marker.
      if (cells.every((c) => Number.isNaN(parseNumberText(c, decimalComma)) && !isMissingCell(c))) {
        columns = cells;
        width = cells.length;
        continue;
      }
    }
    if (width === 0) width = cells.length;
    if (width > 2) {
      throw new InputError([inputProblem(field, 'too-many-columns', `line ${i + 1} has ${cells.length} values; give one (the difference) or two (treated and control) per line`)]);
    }
    if (cells.length !== width) {
      throw new InputError([
        inputProblem(
          field,
          'unequal-columns',
          `line ${i + 1} has ${cells.length} ${cells.length === 1 ? 'value' : 'values'} but the first line has ${width}; every line needs the same number (missing values can be written NA)`,
        ),
      ]);
    }
    rowsRead++;
    const values = cells.map((cell) => {
      if (isMissingCell(cell)) return NaN;
      const v = parseNumberText(cell, decimalComma);
      if (Number.isNaN(v)) throw new InputError([inputProblem(field, 'not-a-number', `line ${i + 1} has "${cell}", which is not a number`, cell)]);
      return v;
    });
    if (values.some(Number.isNaN)) {
      dropped++;
      continue;
    }
    first.push(values[0]);
    if (width === 2) second.push(values[1]);
  }
  if (rowsRead === 0) throw new InputError([inputProblem(field, 'empty', 'paste one number per pair (the difference), or two (treated and control)')]);
  const data: PairsData =
    width === 1
      ? { kind: 'differences', differences: Float64Array.from(first) }
      : { kind: 'outcomes', treated: Float64Array.from(first), control: Float64Array.from(second) };
  const warnings = dropped > 0 ? [`${dropped} of ${rowsRead} lines were left out because a value was missing.`] : [];
  return Object.freeze({
    data,
    columns: Object.freeze(columns),
    rowsRead,
    droppedRows: dropped,
    pairs: rowsRead - dropped,
    binary: false,
    warnings: Object.freeze(warnings),
  });
}

/**
 * Reads the two counts of discordant pairs typed by a person (whole numbers, 0 or more; thousands separators
 * allowed: "1,200" is 1200).
 * @throws InputError with field `treatedOnly` or `controlOnly`
 */
export function discordantFromText(treatedOnly: string, controlOnly: string): PairsData {
  const reader = fieldReader();
  const read = (text: string, field: string): number => {
    if (String(text ?? '').trim() === '') {
      reader.problems.push(inputProblem(field, 'missing', 'give a count of pairs (a whole number, 0 or more)'));
      return NaN;
    }
    const v = reader.number(field, text, 'whole');
    if (v !== null && v < 0) reader.problems.push(inputProblem(field, 'not-count', `must be a whole number of pairs, 0 or more, got "${String(text).trim()}"`, text));
    return v ?? NaN;
  };
  const a = read(treatedOnly, 'treatedOnly');
  const b = read(controlOnly, 'controlOnly');
  if (reader.problems.length > 0) throw new InputError(reader.problems);
  return { kind: 'discordant', treatedOnly: a, controlOnly: b };
}
