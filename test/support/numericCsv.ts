import { readReferenceText } from './reference';

/** A plain all-numeric CSV fixture from test/reference/ (quoted header, no missing cells) as names and rows. */
export function readNumericCsv(name: string): { names: string[]; rows: number[][] } {
  const lines = readReferenceText(name).trim().split(/\r?\n/);
  return { names: lines[0].split(',').map((h) => h.replace(/"/g, '')), rows: lines.slice(1).map((l) => l.split(',').map(Number)) };
}
