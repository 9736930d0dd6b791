import { methodById } from '../methods/registry';
import type { Appraisal, Finding } from './appraisal';

/**
 * The workspace's list of findings as plain functions: each returns a new list (the old one is left as it was),
 * so the page keeps one source of truth and every change is one assignment.
 */

/** A new plain id: `f` and one more than the highest number used so far (ids never come back after a removal). */
export function nextFindingId(findings: readonly Finding[]): string {
  let highest = 0;
  for (const f of findings) {
    const match = /^f(\d+)$/.exec(f.id);
    if (match) highest = Math.max(highest, Number(match[1]));
  }
  return `f${Math.max(highest, findings.length) + 1}`;
}

/** A name for a new finding of a method until the reviewer gives one: the method's title, numbered after the first. */
export function defaultFindingName(findings: readonly Finding[], method: string): string {
  const title = methodById(method)?.title ?? method;
  const taken = new Set(findings.map((f) => f.name));
  if (!taken.has(title)) return title;
  for (let n = 2; ; n++) if (!taken.has(`${title} ${n}`)) return `${title} ${n}`;
}

/** The list with a new finding at its end (inputs as typed, no summary yet), and the new finding. */
export function withNewFinding(findings: readonly Finding[], method: string, name?: string, inputs: Record<string, unknown> = {}): { findings: Finding[]; finding: Finding } {
  const finding: Finding = { id: nextFindingId(findings), method, name: name ?? defaultFindingName(findings, method), inputs, summary: null };
  return { findings: [...findings, finding], finding };
}

/** The list with one finding changed (matched by id). */
export function withFindingChanged(findings: readonly Finding[], id: string, change: Partial<Omit<Finding, 'id' | 'method'>>): Finding[] {
  return findings.map((f) => (f.id === id ? { ...f, ...change } : f));
}

/** The list without one finding. */
export function withoutFinding(findings: readonly Finding[], id: string): Finding[] {
  return findings.filter((f) => f.id !== id);
}

/**
 * Text as part of a file name: letters and digits (accents dropped), other runs of characters as one "-", at
 * most `max` characters, lower case; `fallback` when nothing is left.
 */
export function fileNamePart(text: string, fallback: string, max = 60): string {
  const plain = text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, max)
    .replace(/-+$/, '')
    .toLowerCase();
  return plain || fallback;
}

/**
 * The name of a saved appraisal: `lurk-` and the study's finding, else the name of the only finding, else
 * "appraisal", in safe file-name characters, with `.json`.
 */
export function appraisalFileName(appraisal: Appraisal): string {
  const named = appraisal.study.finding.trim() || (appraisal.findings.length === 1 ? appraisal.findings[0].name : '');
  return `lurk-${fileNamePart(named, 'appraisal')}.json`;
}
