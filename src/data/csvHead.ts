import { InputError } from '../core/inputProblem';
import { readCsvText } from './csv';

/** Bytes read to find a CSV's header and first rows (the page's column pickers). */
const HEAD_BYTES = 256 * 1024;

/**
 * The columns of a chosen file, read from its first 256 KiB (the last, possibly cut, line left out), or the reason
 * it cannot be read. For the column pickers of the calculators that read a whole file later.
 */
export async function readCsvHeadColumns(file: Blob & { name: string }): Promise<{ columns: readonly string[]; problem: string }> {
  try {
    const head = await file.slice(0, HEAD_BYTES).text();
    const complete = file.size > HEAD_BYTES ? head.slice(0, Math.max(head.lastIndexOf('\n'), 0)) : head;
    return { columns: readCsvText(complete || head, 'file').columns, problem: '' };
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return { columns: [], problem: `${file.name}: ${error.problems.map((p) => p.message).join('; ')}` };
  }
}
