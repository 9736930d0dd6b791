import { inputProblem, InputError, type InputProblem } from '../../core/inputProblem';
import { validatePairsInput, type PairsData, type PairsInput } from '../../core/pairsAnalysis';
import type { TailMethod } from '../../core/signedRankBound';
import { parseTypedNumber } from '../../data/numberText';
import type { PairsColumns, PairsRead } from './pairsFromCsv';
import { discordantFromText, pairsFromPastedText } from './pairsFromText';

/** Where the pairs come from. */
export type PairsSource = 'file' | 'pasted' | 'discordant';

/**
 * Everything the matched-pairs form holds, as the user typed it (text, never parsed numbers), so nothing is
 * lost and the form can be saved and restored. A file's rows are not part of it, only its name and the
 * column choices; pasted numbers are (`pasted`), since the user typed them.
 */
export interface PairsFormInputs {
  readonly source: PairsSource;
  readonly fileName: string;
  /** `outcomes`: a treated and a control column; `difference`: one column of treated − control. */
  readonly columnsBy: 'outcomes' | 'difference';
  readonly treatedColumn: string;
  readonly controlColumn: string;
  readonly differenceColumn: string;
  readonly pasted: string;
  readonly treatedOnly: string;
  readonly controlOnly: string;
  readonly test: 'signrank' | 'sign';
  readonly alternative: 'greater' | 'less';
  readonly alpha: string;
  /** Γ values separated by commas, semicolons or spaces; empty for the automatic grid. */
  readonly gammas: string;
  readonly method: 'auto' | TailMethod;
}

export function emptyPairsForm(): PairsFormInputs {
  return Object.freeze({
    source: 'file',
    fileName: '',
    columnsBy: 'outcomes',
    treatedColumn: '',
    controlColumn: '',
    differenceColumn: '',
    pasted: '',
    treatedOnly: '',
    controlOnly: '',
    test: 'signrank',
    alternative: 'greater',
    alpha: '0.05',
    gammas: '',
    method: 'auto',
  });
}

/** Completes a saved or partial form object (unknown keys dropped, wrong types replaced by defaults). */
export function normalisePairsForm(saved: unknown): PairsFormInputs {
  const base = emptyPairsForm();
  if (saved === null || typeof saved !== 'object') return base;
  const s = saved as Record<string, unknown>;
  const text = (key: keyof PairsFormInputs) => (typeof s[key] === 'string' ? (s[key] as string) : (base[key] as string));
  const pick = <T extends string>(key: keyof PairsFormInputs, choices: readonly T[]) => (choices.includes(s[key] as T) ? (s[key] as T) : (base[key] as T));
  return Object.freeze({
    source: pick('source', ['file', 'pasted', 'discordant'] as const),
    fileName: text('fileName'),
    columnsBy: pick('columnsBy', ['outcomes', 'difference'] as const),
    treatedColumn: text('treatedColumn'),
    controlColumn: text('controlColumn'),
    differenceColumn: text('differenceColumn'),
    pasted: text('pasted'),
    treatedOnly: text('treatedOnly'),
    controlOnly: text('controlOnly'),
    test: pick('test', ['signrank', 'sign'] as const),
    alternative: pick('alternative', ['greater', 'less'] as const),
    alpha: text('alpha'),
    gammas: text('gammas'),
    method: pick('method', ['auto', 'exact', 'normal'] as const),
  });
}

/** The column choice of the form, as the CSV reader takes it. */
export function pairsColumnsOf(form: PairsFormInputs): PairsColumns {
  return form.columnsBy === 'difference'
    ? { difference: form.differenceColumn }
    : { treated: form.treatedColumn, control: form.controlColumn };
}

/**
 * Guesses the columns of a pairs file from its header: "treated"/"control"-like names, else a
 * "difference"-like name, else the only column.
 */
export function guessPairsColumns(columns: readonly string[]): Pick<PairsFormInputs, 'columnsBy' | 'treatedColumn' | 'controlColumn' | 'differenceColumn'> {
  const find = (pattern: RegExp) => columns.find((c) => pattern.test(c.trim())) ?? '';
  const treated = find(/^(treated|treatment|exposed|case)s?\b|treated/i);
  const control = find(/^(control|untreated|unexposed|comparison)s?\b|control/i);
  const difference = find(/^(d|diff|difference|differences|delta)$|differ/i);
  if (treated && control && treated !== control) return { columnsBy: 'outcomes', treatedColumn: treated, controlColumn: control, differenceColumn: difference };
  if (difference || columns.length === 1) return { columnsBy: 'difference', treatedColumn: '', controlColumn: '', differenceColumn: difference || columns[0] };
  return { columnsBy: 'outcomes', treatedColumn: '', controlColumn: '', differenceColumn: '' };
}

/** α and the Γ list as typed, with problems named by the form's fields. */
export function readPairsOptions(form: PairsFormInputs): { alpha?: number; gammas?: number[]; problems: InputProblem[] } {
  const problems: InputProblem[] = [];
  let alpha: number | undefined;
  if (form.alpha.trim() === '') alpha = undefined;
  else {
    alpha = parseTypedNumber(form.alpha);
    if (Number.isNaN(alpha)) problems.push(inputProblem('alpha', 'not-a-number', `"${form.alpha}" is not a number; write e.g. 0.05`, form.alpha));
  }
  let gammas: number[] | undefined;
  if (form.gammas.trim() !== '') {
    // Semicolons separate values; else commas do ("1, 1.5, 2"), unless only spaces separate ("1,5 2,5").
    const text = form.gammas.trim();
    const items = (text.includes(';') ? text.split(';') : /,\s|^[^\s]*$/.test(text) ? text.split(',') : text.split(/\s+/))
      .map((p) => p.trim())
      .filter((p) => p !== '');
    gammas = [];
    items.forEach((item, i) => {
      const value = parseTypedNumber(item);
      if (Number.isNaN(value)) problems.push(inputProblem(`gammas[${i}]`, 'not-a-number', `"${item}" is not a number`, item));
      gammas!.push(value);
    });
  }
  return { alpha, gammas, problems };
}

/**
 * Turns the form (and, for a file, the pairs read from it) into the analysis input, or the problems that
 * prevent one — every problem named by a form field (`alpha`, `gammas`, `pasted`, `treatedOnly`, `file`, …).
 * Does not run the analysis.
 */
export function pairsInputFromForm(form: PairsFormInputs, read: PairsRead | null): { input: PairsInput | null; read: PairsRead | null; problems: InputProblem[] } {
  const problems: InputProblem[] = [];
  const options = readPairsOptions(form);
  problems.push(...options.problems);
  let data: PairsData | null = null;
  let used = read;
  try {
    if (form.source === 'discordant') data = discordantFromText(form.treatedOnly, form.controlOnly);
    else if (form.source === 'pasted') {
      used = pairsFromPastedText(form.pasted, 'pasted');
      data = used.data;
    } else if (read) data = read.data;
    else problems.push(inputProblem('file', 'required', 'choose a CSV file of pairs'));
  } catch (error) {
    if (error instanceof InputError) problems.push(...error.problems);
    else throw error;
  }
  if (form.source !== 'pasted' && form.source !== 'file') used = null;
  if (!data) return { input: null, read: used, problems };
  const input: PairsInput = {
    data,
    test: form.test,
    alternative: form.alternative,
    alpha: options.alpha,
    gammas: options.gammas && options.gammas.every((g) => !Number.isNaN(g)) ? options.gammas : undefined,
    method: form.method,
    droppedRows: used?.droppedRows ?? 0,
  };
  const field = form.source === 'pasted' ? 'pasted' : form.source === 'file' ? 'file' : 'treatedOnly';
  for (const p of validatePairsInput(input)) {
    if (options.problems.some((q) => q.field === p.field)) continue;
    problems.push(p.field.startsWith('data') ? { ...p, field: p.field === 'data.controlOnly' ? 'controlOnly' : field } : p);
  }
  return { input: problems.length === 0 ? input : null, read: used, problems };
}
