import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** Reads a JSON fixture from test/reference/ (copied from the project's shared reference set, provenance inside). */
export function readReferenceJson<T = any>(name: string): T {
  return JSON.parse(readFileSync(referencePath(name), 'utf8')) as T;
}

/** Reads a text fixture (CSV) from test/reference/. */
export function readReferenceText(name: string): string {
  return readFileSync(referencePath(name), 'utf8');
}

export function referencePath(name: string): string {
  return fileURLToPath(new URL(`../reference/${name}`, import.meta.url));
}

/** Fixture JSON writes infinities as the strings "Inf"/"-Inf" and "not available" as null. */
export function fromFixtureNumber(v: number | string | null): number | null {
  if (v === 'Inf') return Infinity;
  if (v === '-Inf') return -Infinity;
  return v as number | null;
}
