import type { InputProblem } from '../../core/inputProblem';
import { validateMatchedSets, type MatchedSetsInput } from '../../core/matchedSetsAnalysis';
import { fieldReader } from '../fieldReader';
import { validateSetsColumns, type SetsColumns, type SetsRead } from './setsFromCsv';

/** The choices of the analysis, as the request reader accepts them (without regard to case). */
export const SETS_ALTERNATIVES = ['greater', 'less'] as const;
export const SETS_OUTCOME_KINDS = ['auto', 'continuous', 'binary'] as const;
export const SETS_TAILS = ['exact', 'normal'] as const;

/**
 * Everything the matched-sets form holds, as the user typed it (text, never parsed numbers). A file's rows are
 * never part of it, only its name and the three column choices. An empty choice or number means the default.
 */
export interface SetsFormInputs {
  readonly fileName: string;
  /** The column holding each unit's set id. */
  readonly setColumn: string;
  /** The column holding 1 for the treated unit of a set, 0 for a control. */
  readonly treatedColumn: string;
  readonly outcomeColumn: string;
  /** Γ values separated by commas, semicolons or spaces; empty for the automatic grid. */
  readonly gammas: string;
  readonly alpha: string;
  /** `greater` or `less`. */
  readonly alternative: string;
  /** c of Huber's ψ in units of σ (continuous outcomes). */
  readonly trim: string;
  /** `auto`, `continuous` or `binary`. */
  readonly outcomeKind: string;
  /** `exact` or `normal` (binary outcomes); empty: exact for a binary outcome (continuous ones always use the normal approximation). */
  readonly tail: string;
}

export function emptySetsForm(): SetsFormInputs {
  return Object.freeze({
    fileName: '',
    setColumn: '',
    treatedColumn: '',
    outcomeColumn: '',
    gammas: '',
    alpha: '0.05',
    alternative: 'greater',
    trim: '2.5',
    outcomeKind: 'auto',
    tail: '',
  });
}

/**
 * Completes a saved or partial form object: unknown keys dropped, numbers taken as their text (2.5 → "2.5"),
 * choices outside the known ones and other wrong types replaced by defaults.
 */
export function normaliseSetsForm(saved: unknown): SetsFormInputs {
  const base = emptySetsForm();
  if (saved === null || typeof saved !== 'object') return base;
  const s = saved as Record<string, unknown>;
  const text = (key: keyof SetsFormInputs) => {
    const value = s[key];
    if (typeof value === 'string') return value;
    if (typeof value === 'number' && Number.isFinite(value)) return String(value);
    return base[key];
  };
  const pick = <T extends string>(key: keyof SetsFormInputs, choices: readonly T[]): T => {
    const value = typeof s[key] === 'string' ? (s[key] as string).trim().toLowerCase() : '';
    return choices.find((c) => c === value) ?? (base[key] as T);
  };
  return Object.freeze({
    fileName: text('fileName'),
    setColumn: text('setColumn'),
    treatedColumn: text('treatedColumn'),
    outcomeColumn: text('outcomeColumn'),
    gammas: text('gammas'),
    alpha: text('alpha'),
    alternative: pick('alternative', SETS_ALTERNATIVES),
    trim: text('trim'),
    outcomeKind: pick('outcomeKind', SETS_OUTCOME_KINDS),
    tail: pick('tail', SETS_TAILS),
  });
}

/** The column choice of the form, as the CSV reader takes it. */
export function setsColumnsOf(form: SetsFormInputs): SetsColumns {
  return { set: form.setColumn, treated: form.treatedColumn, outcome: form.outcomeColumn };
}

/**
 * Guesses the columns of a matched-sets file from its header: a "set"/"stratum"/"match"-like name for the set
 * id, a "treated"/"treatment"/"exposed"/"case"-like name for the flag, an "outcome"/"y"/"response"-like name for
 * the outcome (else the one remaining column). Empty where nothing fits.
 */
export function guessSetsColumns(columns: readonly string[]): Pick<SetsFormInputs, 'setColumn' | 'treatedColumn' | 'outcomeColumn'> {
  const find = (pattern: RegExp, taken: string[]) => columns.find((c) => !taken.includes(c) && pattern.test(c.trim())) ?? '';
  const setColumn = find(/^(set|sets|set_?id|matched_?set|stratum|strata|match|match_?id|matched|block|group|pair|cluster)\b|set|strat|match/i, []);
  const treatedColumn = find(/^(treated|treatment|treat|exposed|exposure|case|z|tr)$|treat|expos/i, [setColumn]);
  let outcomeColumn = find(/^(outcome|y|response|result|score|event)$|outcome|response/i, [setColumn, treatedColumn]);
  if (!outcomeColumn && setColumn && treatedColumn) {
    const rest = columns.filter((c) => c !== setColumn && c !== treatedColumn);
    if (rest.length === 1) outcomeColumn = rest[0];
  }
  return { setColumn, treatedColumn, outcomeColumn };
}

/** The analysis settings of the form, read: everything of the analysis input except the data. */
export type SetsSettings = Omit<MatchedSetsInput, 'setIds' | 'treated' | 'outcomes'> & { readonly problems: InputProblem[] };

/**
 * Reads the analysis settings with the one field reader: choices without regard to case, α as a fraction ("5%"
 * = 0.05), c of ψ as a decimal, Γ as a list of decimals. Empty text is left undefined (the analysis default).
 */
export function readSetsSettings(form: SetsFormInputs): SetsSettings {
  const reader = fieldReader();
  const alternative = reader.choice('alternative', form.alternative, SETS_ALTERNATIVES) ?? undefined;
  const outcomeKind = reader.choice('outcomeKind', form.outcomeKind, SETS_OUTCOME_KINDS) ?? undefined;
  const tail = reader.choice('tail', form.tail, SETS_TAILS) ?? undefined;
  const alpha = reader.number('alpha', form.alpha, 'fraction') ?? undefined;
  const trim = reader.number('trim', form.trim, 'decimal') ?? undefined;
  const gammas = reader.numberList('gammas', form.gammas, 'decimal') ?? undefined;
  return { alternative, outcomeKind, tail, alpha, trim, gammas, problems: reader.problems };
}

/**
 * Every problem of the settings alone, before any data is read: the field reader's (not a number, not a choice)
 * and the analysis's own rules on the settings (α in (0, 0.5], c > 0, each Γ ≥ 1), with the same messages the
 * page shows once the data are there.
 */
export function setsSettingsProblems(form: SetsFormInputs): InputProblem[] {
  const { problems: readerProblems, ...settings } = readSetsSettings(form);
  const base = (field: string) => field.replace(/\[.*$/, '');
  const dataFields = ['setIds', 'treated', 'outcomes'];
  const rules = validateMatchedSets({ setIds: [], treated: [], outcomes: [], ...settings }).filter(
    (p) => !dataFields.includes(p.field) && !readerProblems.some((q) => base(q.field) === base(p.field)),
  );
  return [...readerProblems, ...rules];
}

/** Fields of the core's problems → the form field that holds them. */
const FORM_FIELD_OF: Readonly<Record<string, string>> = { setIds: 'setColumn', treated: 'treatedColumn', outcomes: 'outcomeColumn' };

/** A core problem named by the form's field (`setIds` → `setColumn`, `gammas[1]` stays). */
export function setsFormProblem(p: InputProblem): InputProblem {
  const field = FORM_FIELD_OF[p.field];
  return field ? { ...p, field } : p;
}

/**
 * Turns the form and the rows read from its file into the analysis input, or the problems that prevent one —
 * every problem named by a form field (`alpha`, `gammas`, `file`, `setColumn`, `treatedColumn`, `outcomeColumn`,
 * …), the data checked by the core's `validateMatchedSets` (its messages name the sets and rows). Does not run
 * the analysis.
 */
export function setsInputFromForm(form: SetsFormInputs, read: SetsRead | null): { input: MatchedSetsInput | null; problems: InputProblem[] } {
  const { problems: settingsProblems, ...settings } = readSetsSettings(form);
  const problems = [...settingsProblems];
  if (!read) {
    problems.push({ field: 'file', code: 'required', message: 'choose a CSV file of matched sets (one row per unit)' });
    return { input: null, problems };
  }
  const input: MatchedSetsInput = { ...read.data, ...settings };
  const base = (field: string) => field.replace(/\[.*$/, '');
  for (const p of validateMatchedSets(input)) {
    if (settingsProblems.some((q) => base(q.field) === base(p.field))) continue;
    problems.push(setsFormProblem(p));
  }
  return { input: problems.length === 0 ? input : null, problems };
}

/** The column choices of the form checked before any file is read (named, all different). */
export function validateSetsColumnsOfForm(form: SetsFormInputs): InputProblem[] {
  return validateSetsColumns(setsColumnsOf(form));
}
