import { inputProblem, InputError, type InputProblem } from '../../core/inputProblem';
import { validatePairsInput, type PairsData, type PairsInput } from '../../core/pairsAnalysis';
import type { TailMethod } from '../../core/signedRankBound';
import { alphaWithinRange, fieldReader, type FieldReader } from '../fieldReader';
import type { PairsColumns, PairsRead } from './pairsFromCsv';
import { discordantFromText, pairsFromPastedText } from './pairsFromText';
import { pairsFromSummaryText } from './pairsFromSummary';

/** Where the pairs come from. */
export type PairsSource = 'file' | 'pasted' | 'discordant' | 'summary';

/** The choices of the analysis, as the request reader accepts them (without regard to case). */
export const PAIRS_TESTS = ['signrank', 'sign'] as const;
export const PAIRS_ALTERNATIVES = ['greater', 'less'] as const;
export const PAIRS_TAIL_METHODS = ['auto', 'exact', 'normal'] as const;
export const PAIRS_OUTCOME_TYPES = ['auto', 'numeric', 'binary'] as const;
/** How the signed-rank test treats zero differences: Wilcoxon's rule (left out) or Pratt's (ranked, scored 0). */
export const PAIRS_ZERO_RULES = ['wilcoxon', 'pratt'] as const;

/**
 * Everything the matched-pairs form holds, as the user typed it (text, never parsed numbers), so nothing is
 * lost and the form can be saved and restored. A file's rows are not part of it, only its name and the
 * column choices; pasted numbers are (`pasted`), since the user typed them. Choices are text too (an empty
 * choice means the default), read by the request reader without regard to case.
 */
export interface PairsFormInputs {
  readonly source: PairsSource;
  readonly fileName: string;
  /** `outcomes`: a treated and a control column; `difference`: one column of treated − control. */
  readonly columnsBy: 'outcomes' | 'difference';
  readonly treatedColumn: string;
  readonly controlColumn: string;
  readonly differenceColumn: string;
  /** How the file's two outcome columns are read: `auto` (0/1 columns are binary), `numeric` or `binary`. */
  readonly outcomeType: string;
  readonly pasted: string;
  readonly treatedOnly: string;
  readonly controlOnly: string;
  /** `signrank` or `sign` (empty: signed-rank, or the sign test for discordant counts). */
  readonly test: string;
  /** `greater` or `less`. */
  readonly alternative: string;
  readonly alpha: string;
  /** Γ values separated by commas, semicolons or spaces; empty for the automatic grid. */
  readonly gammas: string;
  /** `auto`, `exact` or `normal`. */
  readonly method: string;
  /** The ½ continuity correction of the normal approximation. */
  readonly continuityCorrection: boolean;
  /** Summary statistics: the table the query reads (its columns are the column fields above), and its pasted result. */
  readonly summaryTable?: string;
  readonly summaryResult?: string;
  /** Zero differences in the signed-rank test: `wilcoxon` (left out; the default when empty) or `pratt`. */
  readonly zeros: string;
}

export function emptyPairsForm(): PairsFormInputs {
  return Object.freeze({
    source: 'file',
    fileName: '',
    columnsBy: 'outcomes',
    treatedColumn: '',
    controlColumn: '',
    differenceColumn: '',
    outcomeType: 'auto',
    pasted: '',
    treatedOnly: '',
    controlOnly: '',
    test: 'signrank',
    alternative: 'greater',
    alpha: '0.05',
    gammas: '',
    method: 'auto',
    continuityCorrection: false,
    summaryTable: '',
    summaryResult: '',
    zeros: 'wilcoxon',
  });
}

/**
 * Completes a saved or partial form object: unknown keys dropped, numbers taken as their text (3.9 → "3.9"),
 * choices outside the known ones and other wrong types replaced by defaults.
 */
export function normalisePairsForm(saved: unknown): PairsFormInputs {
  const base = emptyPairsForm();
  if (saved === null || typeof saved !== 'object') return base;
  const s = saved as Record<string, unknown>;
  const text = (key: keyof PairsFormInputs) => {
    const value = s[key];
    if (typeof value === 'string') return value;
    if (typeof value === 'number' && Number.isFinite(value)) return String(value);
    return base[key] as string;
  };
  const pick = <T extends string>(key: keyof PairsFormInputs, choices: readonly T[]): T => {
    const value = typeof s[key] === 'string' ? (s[key] as string).trim().toLowerCase() : '';
    return choices.find((c) => c === value) ?? (base[key] as T);
  };
  return Object.freeze({
    source: pick('source', ['file', 'pasted', 'discordant', 'summary'] as const),
    fileName: text('fileName'),
    columnsBy: pick('columnsBy', ['outcomes', 'difference'] as const),
    treatedColumn: text('treatedColumn'),
    controlColumn: text('controlColumn'),
    differenceColumn: text('differenceColumn'),
    outcomeType: pick('outcomeType', PAIRS_OUTCOME_TYPES),
    pasted: text('pasted'),
    treatedOnly: text('treatedOnly'),
    controlOnly: text('controlOnly'),
    test: pick('test', PAIRS_TESTS),
    alternative: pick('alternative', PAIRS_ALTERNATIVES),
    alpha: text('alpha'),
    gammas: text('gammas'),
    method: pick('method', PAIRS_TAIL_METHODS),
    continuityCorrection: s.continuityCorrection === true,
    summaryTable: text('summaryTable'),
    summaryResult: text('summaryResult'),
    zeros: pick('zeros', PAIRS_ZERO_RULES),
  });
}

/** The column choice of the form, as the CSV reader takes it (an unknown outcome type reads as `auto`). */
export function pairsColumnsOf(form: PairsFormInputs): PairsColumns {
  const typed = String(form.outcomeType ?? '').trim().toLowerCase();
  const outcome = PAIRS_OUTCOME_TYPES.find((t) => t === typed) ?? 'auto';
  return form.columnsBy === 'difference'
    ? { difference: form.differenceColumn, outcome }
    : { treated: form.treatedColumn, control: form.controlColumn, outcome };
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

/** The analysis settings of the form, read: everything of the analysis input except the data. */
export interface PairsSettings {
  readonly test?: 'signrank' | 'sign';
  readonly alternative?: 'greater' | 'less';
  readonly method?: 'auto' | TailMethod;
  readonly outcome?: 'auto' | 'numeric' | 'binary';
  readonly alpha?: number;
  readonly gammas?: number[];
  readonly continuityCorrection: boolean;
  readonly zeroRule?: 'wilcoxon' | 'pratt';
  readonly problems: InputProblem[];
}

/**
 * Reads the analysis settings (test, alternative, tail method, outcome type, α, Γ list) with the one field
 * reader: choices without regard to case, α as a fraction ("5%" = 0.05), Γ as a list of decimals. An empty
 * choice or number is left undefined (the analysis default).
 */
export function readPairsSettings(form: PairsFormInputs): PairsSettings {
  const reader = fieldReader();
  const test = reader.choice('test', form.test, PAIRS_TESTS) ?? undefined;
  const alternative = reader.choice('alternative', form.alternative, PAIRS_ALTERNATIVES) ?? undefined;
  const method = reader.choice('method', form.method, PAIRS_TAIL_METHODS) ?? undefined;
  const outcome = reader.choice('outcomeType', form.outcomeType, PAIRS_OUTCOME_TYPES) ?? undefined;
  const alpha = alphaWithinRange(reader, 'alpha', reader.number('alpha', form.alpha, 'fraction')) ?? undefined;
  const gammas = boundedGammas(reader, reader.numberList('gammas', form.gammas, 'decimal')) ?? undefined;
  const zeroRule = reader.choice('zeros', form.zeros ?? '', PAIRS_ZERO_RULES) ?? undefined;
  return { test, alternative, method, outcome, alpha, gammas, continuityCorrection: form.continuityCorrection === true, zeroRule, problems: reader.problems };
}

/** α and the Γ list as typed, with problems named by the form's fields (see {@link readPairsSettings}). */
export function readPairsOptions(form: PairsFormInputs): { alpha?: number; gammas?: number[]; problems: InputProblem[] } {
  const settings = readPairsSettings(form);
  return { alpha: settings.alpha, gammas: settings.gammas, problems: settings.problems.filter((p) => p.field === 'alpha' || p.field.startsWith('gammas')) };
}

/**
 * Turns the form (and, for a file, the pairs read from it) into the analysis input, or the problems that
 * prevent one — every problem named by a form field (`alpha`, `gammas`, `pasted`, `treatedOnly`, `file`, …).
 * Does not run the analysis.
 */
export function pairsInputFromForm(form: PairsFormInputs, read: PairsRead | null): { input: PairsInput | null; read: PairsRead | null; problems: InputProblem[] } {
  const problems: InputProblem[] = [];
  const options = readPairsSettings(form);
  problems.push(...options.problems);
  let data: PairsData | null = null;
  let used = read;
  try {
    if (form.source === 'discordant') data = discordantFromText(form.treatedOnly, form.controlOnly);
    else if (form.source === 'pasted') {
      used = pairsFromPastedText(form.pasted, 'pasted');
      data = used.data;
    } else if (form.source === 'summary') {
      used = pairsFromSummaryText(form.summaryResult ?? '', 'summaryResult');
      data = used.data;
    } else if (read) data = read.data;
    else problems.push(inputProblem('file', 'required', 'choose a CSV file of pairs'));
  } catch (error) {
    if (error instanceof InputError) problems.push(...error.problems);
    else throw error;
  }
  if (form.source === 'discordant') used = null;
  if (!data) return { input: null, read: used, problems };
  const input: PairsInput = {
    data,
    test: options.test,
    alternative: options.alternative,
    alpha: options.alpha,
    gammas: options.gammas,
    method: options.method,
    continuityCorrection: options.continuityCorrection,
    ...(options.zeroRule ? { zeroRule: options.zeroRule } : {}),
    droppedRows: used?.droppedRows ?? 0,
  };
  const field = form.source === 'pasted' ? 'pasted' : form.source === 'file' ? 'file' : form.source === 'summary' ? 'summaryResult' : 'treatedOnly';
  for (const p of validatePairsInput(input)) {
    if (options.problems.some((q) => q.field === p.field || (q.field === 'gammas' && p.field.startsWith('gammas')))) continue;
    const column = form.source === 'summary' ? SUMMARY_COLUMNS[p.field.replace(/^data\./, '')] : undefined;
    if (column) problems.push({ ...p, field, message: `column ${column} ${p.message}` });
    else problems.push(p.field.startsWith('data') ? { ...p, field: p.field === 'data.controlOnly' ? 'controlOnly' : field } : p);
  }
  return { input: problems.length === 0 ? input : null, read: used, problems };
}

/** The result columns of the matched-pairs query that hold each field of a signed-rank summary. */
const SUMMARY_COLUMNS: Readonly<Record<string, string>> = {
  pairs: 'pairs',
  zeros: 'zeros',
  nonZero: 'non_zero',
  positive: 'positive',
  statistic: 'rank_sum_positive',
  sumRanks: 'rank_sum',
  sumSquaredRanks: 'rank_sum_squares',
};
/** The largest Γ tabulated: the tipping-point search stops there too (larger values are typing slips). */
const MAX_GAMMA = 1e6;
/** The most Γ values tabulated at once. */
const MAX_GAMMAS = 200;

/** A Γ list within [1, 1e6] and at most 200 values long, or null (with a problem) when it is not. */
function boundedGammas(reader: FieldReader, gammas: number[] | null): number[] | null {
  if (gammas === null) return null;
  if (gammas.length > MAX_GAMMAS) {
    reader.problems.push(inputProblem('gammas', 'too-many', `has ${gammas.length} values; give at most ${MAX_GAMMAS}`));
    return null;
  }
  const i = gammas.findIndex((g) => g > MAX_GAMMA);
  if (i >= 0) {
    reader.problems.push(inputProblem('gammas', 'outside-range', `item ${i + 1} is ${gammas[i]}; each Γ must be at most ${MAX_GAMMA.toLocaleString('en')} (the largest bias searched)`, gammas[i]));
    return null;
  }
  return gammas;
}
