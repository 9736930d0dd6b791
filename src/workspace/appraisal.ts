import { inputProblem, type InputProblem } from '../core/inputProblem';
import type { FindingLabels, StudyLabels } from '../format/studyLabels';
import { METHODS } from '../methods/registry';
import { validate as validateAppraisalSchema, type SchemaError } from './appraisalValidator.generated.js';

/** The methods whose inputs an appraisal carries: every method of the registry, by its id. */
export const CALCULATORS: readonly string[] = Object.freeze(METHODS.map((m) => m.id));
export type CalculatorName = string;

export const APPRAISAL_FORMAT = 'lurk-appraisal';
/**
 * The version written. Version 2 holds a list of findings; version 1 (one entry per calculator) is still read,
 * each calculator's entry becoming one finding. `readAppraisal` says plainly when a file is from a newer version.
 */
export const APPRAISAL_VERSION = 2;
/** Every version this Lurk reads. */
export const READABLE_VERSIONS: readonly number[] = Object.freeze([1, 2]);

/**
 * Headline numbers of one result, kept beside its inputs so that a statement can be written from the file
 * alone (raw data files are never stored in an appraisal). Each value is a finite number, a string, a boolean or
 * null; nested records are allowed one level deep (e.g. the strongest benchmark).
 */
export type CalculatorSummary = Record<string, SummaryValue>;
export type SummaryValue = number | string | boolean | null | ReadonlyArray<Record<string, number | string | boolean | null>> | Record<string, number | string | boolean | null>;

/** One calculator's inputs and summary (the entry of a version-1 file, and the handy form for `createAppraisal`). */
export interface CalculatorEntry {
  /** The form fields as the user typed them (text), so nothing typed is lost. */
  readonly inputs: Record<string, unknown>;
  /** Headline numbers of the last result, or null when the inputs did not give one. */
  readonly summary: CalculatorSummary | null;
}

/** One finding of the paper appraised with one method (an odds ratio with the E-value, a coefficient with the robustness value…). */
export interface Finding extends CalculatorEntry {
  /** A plain id, unique within the appraisal (letters, digits, - and _). */
  readonly id: string;
  /** The method's id in the registry (`evalue`, `pairs`, `regression`, …). */
  readonly method: string;
  /** The short name the reviewer gave it, e.g. "Mortality, hazard ratio" (may be empty). */
  readonly name: string;
  /** Its own exposure, outcome and units where they differ from the study's (see `labelsOfFinding`). */
  readonly labels?: FindingLabels;
}

/** The batch table of many reported findings, as typed. */
export interface BatchTable {
  /** The CSV text. */
  readonly text: string;
  /** The significance level of the robustness values, as typed. */
  readonly alpha: string;
}

/** Everything needed to restore an appraisal and to write its statement. */
export interface Appraisal {
  readonly format: typeof APPRAISAL_FORMAT;
  readonly version: typeof APPRAISAL_VERSION;
  /** ISO 8601 time of saving. */
  readonly savedAt: string;
  readonly study: StudyLabels;
  readonly findings: readonly Finding[];
  /** The batch table, when there is one. */
  readonly batch?: BatchTable;
}

/**
 * Builds an appraisal record (frozen) from the workspace's state: a list of findings, or (the shape of a
 * version-1 file) one entry per calculator, each becoming one finding named after its method.
 */
export function createAppraisal(
  study: StudyLabels,
  findings: readonly Finding[] | Partial<Record<CalculatorName, CalculatorEntry>>,
  savedAt: Date = new Date(),
  batch?: BatchTable,
): Appraisal {
  const list = Array.isArray(findings) ? (findings as readonly Finding[]) : findingsFromCalculators(findings as Partial<Record<CalculatorName, CalculatorEntry>>);
  return Object.freeze({
    format: APPRAISAL_FORMAT,
    version: APPRAISAL_VERSION,
    savedAt: savedAt.toISOString(),
    study: Object.freeze({ ...study }),
    findings: Object.freeze(list.map((f) => Object.freeze({ id: f.id, method: f.method, name: f.name, ...(f.labels ? { labels: Object.freeze({ ...f.labels }) } : {}), inputs: f.inputs, summary: f.summary }))),
    ...(batch ? { batch: Object.freeze({ text: batch.text, alpha: batch.alpha }) } : {}),
  });
}

/**
 * One finding per calculator entry (the reading of a version-1 file), in registry order: its id is the method's
 * id and its name the method's title.
 */
export function findingsFromCalculators(calculators: Partial<Record<CalculatorName, CalculatorEntry>>): Finding[] {
  const out: Finding[] = [];
  for (const method of METHODS) {
    const entry = calculators[method.id];
    if (entry) out.push({ id: method.id, method: method.id, name: method.title, inputs: entry.inputs, summary: entry.summary });
  }
  return out;
}

/** The findings of one method, in the appraisal's order. */
export function findingsOf(appraisal: Appraisal, method: string): Finding[] {
  return appraisal.findings.filter((f) => f.method === method);
}

/**
 * Reads an appraisal from parsed JSON, checking every field against the shipped JSON Schema
 * (`src/workspace/appraisal.schema.json`, compiled into `appraisalValidator.generated.js`): the study labels,
 * every finding's inputs and its saved summary. A version-1 file is read as one finding per calculator. Returns
 * the appraisal, or the problem found with the path of the field it concerns (`findings[2].inputs.estimate`;
 * `calculators.evalue.summary.measure` in a version-1 file).
 */
export function readAppraisal(json: unknown): { appraisal: Appraisal; problems: [] } | { appraisal: null; problems: InputProblem[] } {
  const refuse = (problem: InputProblem) => ({ appraisal: null, problems: [problem] });
  if (!isRecord(json)) return refuse(inputProblem('appraisal', 'not-an-object', 'is not a Lurk appraisal (expected a JSON object)'));
  // The marks first, with plain messages: another kind of file, or another version of this one.
  if (json.format !== APPRAISAL_FORMAT) {
    return refuse(inputProblem('format', 'wrong-format', `must be "${APPRAISAL_FORMAT}"; this is not a Lurk appraisal`, json.format));
  }
  if (json.version === undefined) return refuse(inputProblem('version', 'required', 'is missing'));
  if (typeof json.version !== 'number' || !READABLE_VERSIONS.includes(json.version)) {
    const v = typeof json.version === 'number' ? json.version : JSON.stringify(json.version);
    const readable = `this Lurk reads versions ${READABLE_VERSIONS.join(' and ')}`;
    const rule =
      typeof json.version === 'number' && json.version > APPRAISAL_VERSION
        ? `is ${v}, made by a newer Lurk; ${readable}: open it with a newer Lurk`
        : `is ${v}; ${readable}`;
    return refuse(inputProblem('version', 'unsupported-version', rule, json.version));
  }
  if (!validateAppraisalSchema(json)) return refuse(schemaProblem(validateAppraisalSchema.errors ?? []));
  if (Number.isNaN(Date.parse(json.savedAt as string))) {
    return refuse(inputProblem('savedAt', 'not-a-date', 'must be a date and time in ISO 8601 form', json.savedAt));
  }
  // A saved summary is checked by the schema here and read again through its method's `readSummary` before it
  // reaches a sentence (see currentSummaries); the inputs are read by the method's request reader.
  if (json.version === 1) {
    const v1 = json as unknown as { savedAt: string; study: StudyLabels; calculators: Partial<Record<CalculatorName, CalculatorEntry>> };
    const appraisal: Appraisal = { format: APPRAISAL_FORMAT, version: APPRAISAL_VERSION, savedAt: v1.savedAt, study: v1.study, findings: findingsFromCalculators(v1.calculators) };
    return { appraisal, problems: [] };
  }
  const findings = json.findings as readonly Finding[];
  const seen = new Map<string, number>();
  for (const [i, finding] of findings.entries()) {
    const earlier = seen.get(finding.id);
    if (earlier !== undefined) return refuse(inputProblem(`findings[${i}].id`, 'duplicate-id', `is also the id of findings[${earlier}]; each finding needs its own id`, finding.id));
    seen.set(finding.id, i);
  }
  return { appraisal: json as unknown as Appraisal, problems: [] };
}

/** The schema's verdict as one problem: the most specific error (deepest field), in plain words. */
function schemaProblem(errors: readonly SchemaError[]): InputProblem {
  if (errors.length === 0) return inputProblem('appraisal', 'invalid', 'does not follow the appraisal format');
  const depth = (e: SchemaError) => e.instancePath.split('/').length + (e.keyword === 'required' || e.keyword === 'additionalProperties' || e.keyword === 'unevaluatedProperties' ? 1 : 0);
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
    case 'additionalProperties':
    case 'unevaluatedProperties': {
      const key = String(p.additionalProperty ?? p.unevaluatedProperty);
      if (path === 'calculators') return inputProblem(at(key), 'unknown-calculator', `is not a calculator (calculators: ${CALCULATORS.join(', ')})`);
      if (path === 'study') return inputProblem(at(key), 'unknown-field', 'is not a study label');
      if (path === '') return inputProblem(key, 'unknown-field', 'is not part of a Lurk appraisal');
      if (/^findings\[\d+\]$/.test(path)) return inputProblem(at(key), 'unknown-field', 'is not a field of a finding (id, method, name, inputs, summary)');
      return inputProblem(at(key), 'unknown-field', `is not a field of ${path}`);
    }
    case 'type':
      return inputProblem(path || 'appraisal', 'wrong-type', `must be ${typeWords(String(p.type))}`);
    case 'const':
      return inputProblem(path, 'not-allowed', `must be ${JSON.stringify(p.allowedValue)}`);
    case 'enum':
      if (/^findings\[\d+\]\.method$/.test(path)) return inputProblem(path, 'unknown-method', `is not a method of this Lurk (methods: ${CALCULATORS.join(', ')})`);
      return inputProblem(path, 'not-a-choice', `must be one of ${(p.allowedValues as unknown[]).map((v) => JSON.stringify(v)).join(', ')}`);
    case 'minimum':
    case 'maximum':
    case 'exclusiveMinimum':
    case 'exclusiveMaximum':
      return inputProblem(path, 'outside-range', `must be ${String(p.comparison)} ${String(p.limit)}`);
    case 'minLength':
      return inputProblem(path, 'required', 'is empty');
    case 'maxLength':
      return inputProblem(path, 'too-long', `must be at most ${String(p.limit)} characters`);
    case 'maxItems':
      return inputProblem(path, 'too-long', `must have at most ${String(p.limit)} items`);
    case 'pattern':
      if (path.endsWith('.id')) return inputProblem(path, 'not-an-id', 'must be letters, digits, - and _ only');
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
