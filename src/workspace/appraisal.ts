import { inputProblem, type InputProblem } from '../core/inputProblem';
import type { StudyLabels } from '../format/studyLabels';
import { METHODS } from '../methods/registry';

/** The calculators whose inputs an appraisal carries: every method of the registry, by its id. */
export const CALCULATORS: readonly string[] = Object.freeze(METHODS.map((m) => m.id));
export type CalculatorName = string;

export const APPRAISAL_FORMAT = 'lurk-appraisal';
/** Bump when the shape changes; `readAppraisal` says plainly when a file is from another version. */
export const APPRAISAL_VERSION = 1;

/**
 * Headline numbers of one calculator, kept beside its inputs so that a statement can be written from the file
 * alone (raw data files are never stored in an appraisal). Each value is a finite number, a string, a boolean or
 * null; nested records are allowed one level deep (e.g. the strongest benchmark).
 */
export type CalculatorSummary = Record<string, SummaryValue>;
export type SummaryValue = number | string | boolean | null | ReadonlyArray<Record<string, number | string | boolean | null>> | Record<string, number | string | boolean | null>;

export interface CalculatorEntry {
  /** The form fields as the user typed them (text), so nothing typed is lost. */
  readonly inputs: Record<string, unknown>;
  /** Headline numbers of the last result, or null when the inputs did not give one. */
  readonly summary: CalculatorSummary | null;
}

/** Everything needed to restore an appraisal and to write its statement. */
export interface Appraisal {
  readonly format: typeof APPRAISAL_FORMAT;
  readonly version: typeof APPRAISAL_VERSION;
  /** ISO 8601 time of saving. */
  readonly savedAt: string;
  readonly study: StudyLabels;
  readonly calculators: Partial<Record<CalculatorName, CalculatorEntry>>;
}

const STUDY_KEYS: ReadonlyArray<keyof StudyLabels> = ['finding', 'exposure', 'outcome', 'units', 'source'];
const MAX_TEXT = 200_000;

/** Builds an appraisal record (frozen) from the workspace's state. */
export function createAppraisal(
  study: StudyLabels,
  calculators: Partial<Record<CalculatorName, CalculatorEntry>>,
  savedAt: Date = new Date(),
): Appraisal {
  return Object.freeze({
    format: APPRAISAL_FORMAT,
    version: APPRAISAL_VERSION,
    savedAt: savedAt.toISOString(),
    study: Object.freeze({ ...study }),
    calculators: Object.freeze({ ...calculators }),
  });
}

/**
 * Reads an appraisal from parsed JSON, checking every field (the same rules as the shipped JSON Schema,
 * `src/workspace/appraisal.schema.json`). Returns the appraisal, or every problem found with the field it concerns.
 */
export function readAppraisal(json: unknown): { appraisal: Appraisal; problems: [] } | { appraisal: null; problems: InputProblem[] } {
  const problems: InputProblem[] = [];
  if (!isRecord(json)) return { appraisal: null, problems: [inputProblem('appraisal', 'not-an-object', 'is not a Lurk appraisal (expected a JSON object)')] };
  if (json.format !== APPRAISAL_FORMAT) {
    problems.push(inputProblem('format', 'wrong-format', `must be "${APPRAISAL_FORMAT}"; this is not a Lurk appraisal`, json.format));
    return { appraisal: null, problems };
  }
  if (json.version !== APPRAISAL_VERSION) {
    const v = typeof json.version === 'number' ? json.version : String(json.version);
    const rule =
      typeof json.version === 'number' && json.version > APPRAISAL_VERSION
        ? `is ${v}, made by a newer Lurk; this one reads version ${APPRAISAL_VERSION}`
        : `is ${v}; this Lurk reads version ${APPRAISAL_VERSION}`;
    problems.push(inputProblem('version', 'unsupported-version', rule, json.version));
    return { appraisal: null, problems };
  }
  if (typeof json.savedAt !== 'string' || Number.isNaN(Date.parse(json.savedAt))) {
    problems.push(inputProblem('savedAt', 'not-a-date', 'must be a date and time in ISO 8601 form', json.savedAt));
  }
  const study = json.study;
  if (!isRecord(study)) problems.push(inputProblem('study', 'not-an-object', 'must be an object with the study labels'));
  else {
    for (const key of STUDY_KEYS) {
      if (typeof study[key] !== 'string') problems.push(inputProblem(`study.${key}`, 'not-text', 'must be text', study[key]));
      else if ((study[key] as string).length > MAX_TEXT) problems.push(inputProblem(`study.${key}`, 'too-long', `must be at most ${MAX_TEXT} characters`));
    }
    for (const key of Object.keys(study)) {
      if (!STUDY_KEYS.includes(key as keyof StudyLabels)) problems.push(inputProblem(`study.${key}`, 'unknown-field', 'is not a study label'));
    }
  }
  const calculators = json.calculators;
  if (!isRecord(calculators)) problems.push(inputProblem('calculators', 'not-an-object', 'must be an object'));
  else {
    for (const [name, entry] of Object.entries(calculators)) {
      const field = `calculators.${name}`;
      if (!CALCULATORS.includes(name as CalculatorName)) {
        problems.push(inputProblem(field, 'unknown-calculator', `is not a calculator (calculators: ${CALCULATORS.join(', ')})`));
        continue;
      }
      if (!isRecord(entry)) {
        problems.push(inputProblem(field, 'not-an-object', 'must be an object with inputs and summary'));
        continue;
      }
      if (!isRecord(entry.inputs)) problems.push(inputProblem(`${field}.inputs`, 'not-an-object', 'must be an object'));
      else checkPlainJson(entry.inputs, `${field}.inputs`, problems, 0);
      if (entry.summary !== null && !isRecord(entry.summary)) problems.push(inputProblem(`${field}.summary`, 'not-an-object', 'must be an object or null'));
      // A saved summary is plain JSON here; it reaches sentences only through its method's `readSummary`, which
      // checks every field (see currentSummaries), so an older or damaged summary is set aside, never shown.
      else if (entry.summary) checkSummary(entry.summary, `${field}.summary`, problems);
      for (const key of Object.keys(entry)) {
        if (key !== 'inputs' && key !== 'summary') problems.push(inputProblem(`${field}.${key}`, 'unknown-field', 'is not part of a calculator entry'));
      }
    }
  }
  for (const key of Object.keys(json)) {
    if (!['format', 'version', 'savedAt', 'study', 'calculators'].includes(key)) {
      problems.push(inputProblem(key, 'unknown-field', 'is not part of a Lurk appraisal'));
    }
  }
  if (problems.length > 0) return { appraisal: null, problems };
  return { appraisal: json as unknown as Appraisal, problems: [] };
}

/** Inputs hold what a form holds: text, numbers, booleans, null, and arrays/objects of those (depth-limited). */
function checkPlainJson(value: unknown, field: string, problems: InputProblem[], depth: number): void {
  if (depth > 6) {
    problems.push(inputProblem(field, 'too-deep', 'is nested too deeply'));
    return;
  }
  if (value === null || typeof value === 'boolean') return;
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) problems.push(inputProblem(field, 'not-finite', 'must be a finite number', value));
    return;
  }
  if (typeof value === 'string') {
    if (value.length > MAX_TEXT) problems.push(inputProblem(field, 'too-long', `must be at most ${MAX_TEXT} characters`));
    return;
  }
  if (Array.isArray(value)) {
    value.forEach((item, i) => checkPlainJson(item, `${field}[${i}]`, problems, depth + 1));
    return;
  }
  if (isRecord(value)) {
    for (const [key, item] of Object.entries(value)) checkPlainJson(item, `${field}.${key}`, problems, depth + 1);
    return;
  }
  problems.push(inputProblem(field, 'not-json', 'must be text, a number, true/false, null, a list or an object'));
}

function checkSummary(summary: Record<string, unknown>, field: string, problems: InputProblem[]): void {
  checkPlainJson(summary, field, problems, 3);
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
