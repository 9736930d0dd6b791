import { inputProblem, type InputProblem } from '../core/inputProblem';
import { APPRAISAL_VERSION, readAppraisal, type Appraisal, type CalculatorName } from './appraisal';
import { crc32 } from '../data/crc32';
import { methodById } from '../methods/registry';

/**
 * Share links carry an appraisal's inputs in the URL fragment (never sent to any server by the browser):
 * `#appraisal=<version>.<base64url JSON>.<CRC-32 hex>`. Raw data rows are removed first. The check digits
 * catch a link that was cut short or edited by hand; the version says which Lurk made it.
 */
export const SHARE_PARAMETER = 'appraisal';

/** Input fields that hold raw data rows (pasted numbers): a share link never carries them. */
export function rawDataFields(calculator: string): readonly string[] {
  return methodById(calculator)?.form.rawDataFields ?? [];
}

/** The appraisal without raw data rows, as carried by a share link. */
export function withoutRawData(appraisal: Appraisal): Appraisal {
  const calculators: Appraisal['calculators'] = {};
  for (const [name, entry] of Object.entries(appraisal.calculators) as [CalculatorName, NonNullable<Appraisal['calculators'][CalculatorName]>][]) {
    const inputs = { ...entry.inputs };
    for (const key of rawDataFields(name)) delete inputs[key];
    calculators[name] = { inputs, summary: entry.summary };
  }
  return { ...appraisal, calculators };
}

/** The URL fragment (starting with #) that carries the appraisal's inputs. */
export function encodeShareFragment(appraisal: Appraisal): string {
  const bytes = new TextEncoder().encode(JSON.stringify(withoutRawData(appraisal)));
  const check = crc32(bytes).toString(16).padStart(8, '0');
  return `#${SHARE_PARAMETER}=${APPRAISAL_VERSION}.${toBase64Url(bytes)}.${check}`;
}

/** Whether a URL fragment carries a shared appraisal at all. */
export function hasShareFragment(fragment: string): boolean {
  return fragment.replace(/^#/, '').startsWith(`${SHARE_PARAMETER}=`);
}

/**
 * Reads a shared appraisal from a URL fragment. A damaged, edited or outdated link gives problems with plain
 * messages (field `link`), and the caller keeps the current work.
 */
export function decodeShareFragment(fragment: string): { appraisal: Appraisal; problems: [] } | { appraisal: null; problems: InputProblem[] } {
  const fail = (code: string, message: string) => ({ appraisal: null, problems: [inputProblem('link', code, message)] });
  const body = fragment.replace(/^#/, '');
  if (!body.startsWith(`${SHARE_PARAMETER}=`)) return fail('not-a-share-link', 'does not carry a Lurk appraisal');
  const parts = body.slice(SHARE_PARAMETER.length + 1).split('.');
  if (parts.length !== 3) return fail('damaged', 'is damaged (it may have been cut short when copied); ask for the link again');
  const [versionText, payload, check] = parts;
  const version = Number(versionText);
  if (!Number.isInteger(version)) return fail('damaged', 'is damaged (its version mark is unreadable); ask for the link again');
  if (version !== APPRAISAL_VERSION) {
    return fail(
      'unsupported-version',
      version > APPRAISAL_VERSION
        ? `was made by a newer Lurk (format ${version}); this one reads format ${APPRAISAL_VERSION}`
        : `was made by an older Lurk (format ${version}) and can no longer be read; ask for a new link`,
    );
  }
  let bytes: Uint8Array;
  try {
    bytes = fromBase64Url(payload);
  } catch {
    return fail('damaged', 'is damaged (it contains characters a share link cannot have); ask for the link again');
  }
  if (crc32(bytes).toString(16).padStart(8, '0') !== check.toLowerCase()) {
    return fail('tampered', 'was changed after it was made, or cut short (its check digits do not match); ask for the link again');
  }
  let json: unknown;
  try {
    json = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch {
    return fail('damaged', 'is damaged (its contents are not readable); ask for the link again');
  }
  const read = readAppraisal(json);
  if (read.appraisal === null) {
    return { appraisal: null, problems: read.problems.map((p) => inputProblem('link', p.code, `holds an invalid appraisal: ${p.field} ${p.message}`)) };
  }
  return read;
}

function toBase64Url(bytes: Uint8Array): string {
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(binary).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

function fromBase64Url(text: string): Uint8Array {
  if (!/^[A-Za-z0-9_-]*$/.test(text)) throw new Error('not base64url');
  const base64 = text.replace(/-/g, '+').replace(/_/g, '/') + '='.repeat((4 - (text.length % 4)) % 4);
  const binary = atob(base64);
  return Uint8Array.from(binary, (c) => c.charCodeAt(0));
}
