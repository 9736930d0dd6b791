import { inputProblem, type InputProblem } from '../core/inputProblem';
import type { StudyLabels } from '../format/studyLabels';
import { METHODS } from '../methods/registry';
import { validate as validateAppraisalSchema, type SchemaError } from './appraisalValidator.generated.js';

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
 * Reads an appraisal from parsed JSON, checking every field against the shipped JSON Schema
 * (`src/workspace/appraisal.schema.json`, compiled into `appraisalValidator.generated.js`): the study labels,
 * every method's inputs and its saved summary. Returns the appraisal, or the problem found with the path of the
 * field it concerns (`calculators.evalue.summary.measure`).
 */
export function readAppraisal(json: unknown): { appraisal: Appraisal; problems: [] } | { appraisal: null; problems: InputProblem[] } {
  const refuse = (problem: InputProblem) => ({ appraisal: null, problems: [problem] });
  if (!isRecord(json)) return refuse(inputProblem('appraisal', 'not-an-object', 'is not a Lurk appraisal (expected a JSON object)'));
  // The marks first, with plain messages: another kind of file, or another version of this one.
  if (json.format !== APPRAISAL_FORMAT) {
    return refuse(inputProblem('format', 'wrong-format', `must be "${APPRAISAL_FORMAT}"; this is not a Lurk appraisal`, json.format));
  }
  if (json.version === undefined) return refuse(inputProblem('version', 'required', 'is missing'));
  if (json.version !== APPRAISAL_VERSION) {
    const v = typeof json.version === 'number' ? json.version : JSON.stringify(json.version);
    const rule =
      typeof json.version === 'number' && json.version > APPRAISAL_VERSION
        ? `is ${v}, made by a newer Lurk; this one reads version ${APPRAISAL_VERSION}`
        : `is ${v}; this Lurk reads version ${APPRAISAL_VERSION}`;
    return refuse(inputProblem('version', 'unsupported-version', rule, json.version));
  }
  if (!validateAppraisalSchema(json)) return refuse(schemaProblem(validateAppraisalSchema.errors ?? []));
  if (Number.isNaN(Date.parse(json.savedAt as string))) {
    return refuse(inputProblem('savedAt', 'not-a-date', 'must be a date and time in ISO 8601 form', json.savedAt));
  }
  // A saved summary is checked by the schema here and read again through its method's `readSummary` before it
  // reaches a sentence (see currentSummaries); the inputs are read by the method's request reader.
  return { appraisal: json as unknown as Appraisal, problems: [] };
}

/** The schema's verdict as one problem: the most specific error (deepest field), in plain words. */
function schemaProblem(errors: readonly SchemaError[]): InputProblem {
  if (errors.length === 0) return inputProblem('appraisal', 'invalid', 'does not follow the appraisal format');
  const depth = (e: SchemaError) => e.instancePath.split('/').length + (e.keyword === 'required' || e.keyword === 'additionalProperties' ? 1 : 0);
  const concrete = errors.filter((e) => e.keyword !== 'anyOf' && e.keyword !== 'if');
  const pool = concrete.length > 0 ? concrete : errors;
  // Among the alternatives of an anyOf (e.g. null or a summary), the branch that went deepest says most.
  const error = pool.reduce((best, e) => (depth(e) > depth(best) || (depth(e) === depth(best) && best.keyword === 'type' && e.keyword !== 'type') ? e : best));
  const path = fieldPath(error.instancePath);
  const at = (key: string) => (path === '' ? key : /^[A-Za-z_$][\w$]*$/.test(key) ? `${path}.${key}` : `${path}[${JSON.stringify(key)}]`);
  const p = error.params;
  switch (error.keyword) {
    case 'required':
      return inputProblem(at(String(p.missingProperty)), 'required', 'is missing');
    case 'additionalProperties': {
      const key = String(p.additionalProperty);
      if (path === 'calculators') return inputProblem(at(key), 'unknown-calculator', `is not a calculator (calculators: ${CALCULATORS.join(', ')})`);
      if (path === 'study') return inputProblem(at(key), 'unknown-field', 'is not a study label');
      if (path === '') return inputProblem(key, 'unknown-field', 'is not part of a Lurk appraisal');
      return inputProblem(at(key), 'unknown-field', `is not a field of ${path}`);
    }
    case 'type':
      return inputProblem(path || 'appraisal', 'wrong-type', `must be ${typeWords(String(p.type))}`);
    case 'const':
      return inputProblem(path, 'not-allowed', `must be ${JSON.stringify(p.allowedValue)}`);
    case 'enum':
      return inputProblem(path, 'not-a-choice', `must be one of ${(p.allowedValues as unknown[]).map((v) => JSON.stringify(v)).join(', ')}`);
    case 'minimum':
    case 'maximum':
    case 'exclusiveMinimum':
    case 'exclusiveMaximum':
      return inputProblem(path, 'outside-range', `must be ${String(p.comparison)} ${String(p.limit)}`);
    case 'maxLength':
      return inputProblem(path, 'too-long', `must be at most ${String(p.limit)} characters`);
    case 'maxItems':
      return inputProblem(path, 'too-long', `must have at most ${String(p.limit)} items`);
    case 'pattern':
      return inputProblem(path, 'not-a-date', 'must be a date and time in ISO 8601 form');
    default:
      return inputProblem(path || 'appraisal', 'invalid', 'does not follow the appraisal format');
  }
}

/** A JSON pointer (`/calculators/evalue/inputs/confounders/0/name`) as a field path (`calculators.evalue.inputs.confounders[0].name`). */
function fieldPath(pointer: string): string {
  let out = '';
  for (const raw of pointer.split('/').slice(1)) {
    const key = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (/^\d+$/.test(key)) out += `[${key}]`;
    else if (/^[A-Za-z_$][\w$]*$/.test(key)) out += out === '' ? key : `.${key}`;
    else out += `[${JSON.stringify(key)}]`;
  }
  return out;
}

function typeWords(types: string): string {
  const words: Record<string, string> = { string: 'text', number: 'a finite number', integer: 'a whole number', boolean: 'true or false', null: 'null', object: 'an object', array: 'a list' };
  return types.split(',').map((t) => words[t] ?? t).join(' or ');
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
