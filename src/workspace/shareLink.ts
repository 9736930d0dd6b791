import { deflateSync, inflateSync } from 'fflate';
import { inputProblem, type InputProblem } from '../core/inputProblem';
import { readAppraisal, type Appraisal, type Finding } from './appraisal';
import { crc32 } from '../data/crc32';
import { methodById } from '../methods/registry';
import { SHARE_LINK_DICTIONARY } from './shareLinkDictionary';

/**
 * Share links carry an appraisal's inputs in the URL fragment (never sent to any server by the browser):
 * `#appraisal=2.<base64url of the JSON, raw DEFLATE with a preset dictionary>.<CRC-32 hex of the compressed bytes>`
 * (the dictionary is `SHARE_LINK_DICTIONARY`: field names and standard sentences links often hold). Raw data
 * rows are removed first, and so is every summary that the inputs give again (only the result of data that does
 * not travel is kept). The check digits catch a link that was cut short or edited by hand; the version says which
 * Lurk made it. Links of version 1 (`#appraisal=1.<base64url JSON>.<CRC-32 hex of the JSON>`) are still read.
 *
 * A link longer than `SHARE_LINK_LIMIT` characters may be cut short by e-mail programs and chat services; the page
 * says so and suggests saving a file instead.
 */
export const SHARE_PARAMETER = 'appraisal';

/** The version of the link's wrapping written now (2: compressed); 1 (plain JSON) is still read. */
export const SHARE_LINK_VERSION: 1 | 2 = 2;

/**
 * The longest share link (whole URL, in characters) the page offers without a warning. Common practice, no
 * source: 2,000 characters is the old limit of a URL in some browsers and mail programs, and beyond it links in
 * e-mail and chat are often wrapped or cut.
 */
export const SHARE_LINK_LIMIT = 2000;

/** Input fields that hold raw data rows (pasted numbers): a share link never carries them. */
export function rawDataFields(calculator: string): readonly string[] {
  return methodById(calculator)?.form.rawDataFields ?? [];
}

/** The appraisal without raw data rows, as carried by a share link. */
export function withoutRawData(appraisal: Appraisal): Appraisal {
  const findings = appraisal.findings.map((finding): Finding => {
    const inputs = { ...finding.inputs };
    for (const key of rawDataFields(finding.method)) delete inputs[key];
    return { ...finding, inputs };
  });
  return { ...appraisal, findings };
}

/**
 * The appraisal as a link carries it: without raw data rows, and without the summaries its inputs give again
 * (a finding's summary stays only when its numbers come from data the link does not carry).
 */
export function sharedAppraisal(appraisal: Appraisal): Appraisal {
  const bare = withoutRawData(appraisal);
  const findings = bare.findings.map((finding): Finding => {
    const method = methodById(finding.method);
    const needsData = method ? method.workspace.needsData(method.form.normalise(finding.inputs)) : true;
    return needsData ? finding : { ...finding, summary: null };
  });
  return { ...bare, findings };
}

/** The URL fragment (starting with #) that carries the appraisal's inputs. */
export function encodeShareFragment(appraisal: Appraisal): string {
  return fragmentOfJson(sharedAppraisal(appraisal));
}

/**
 * The fragment of any JSON value in link format 2 (or 1, plain JSON, as earlier Lurks wrote it), with valid check
 * digits: for tests of old links and of edited ones.
 */
export function fragmentOfJson(json: unknown, linkVersion: 1 | 2 = SHARE_LINK_VERSION): string {
  const text = new TextEncoder().encode(JSON.stringify(json));
  const bytes = linkVersion === 1 ? text : deflateSync(text, { level: 9, dictionary: dictionaryBytes() });
  return `#${SHARE_PARAMETER}=${linkVersion}.${toBase64Url(bytes)}.${checkDigits(bytes)}`;
}

/** Whether a share link (the whole URL) is longer than `SHARE_LINK_LIMIT`, and a plain message when it is. */
export function shareLinkLength(url: string): { length: number; tooLong: boolean; message: string } {
  const length = url.length;
  const tooLong = length > SHARE_LINK_LIMIT;
  const message = tooLong
    ? `This share link is ${length.toLocaleString('en')} characters long, more than the ${SHARE_LINK_LIMIT.toLocaleString('en')} that e-mail and chat reliably keep; it may arrive cut short. Save the appraisal as a file and send that instead.`
    : '';
  return { length, tooLong, message };
}

/** Whether a URL fragment carries a shared appraisal at all. */
export function hasShareFragment(fragment: string): boolean {
  return fragment.replace(/^#/, '').startsWith(`${SHARE_PARAMETER}=`);
}

/**
 * Reads a shared appraisal from a URL fragment (link version 2, or 1 from earlier Lurks). A damaged, edited or
 * outdated link gives problems with plain messages (field `link`), and the caller keeps the current work.
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
  if (version !== 1 && version !== SHARE_LINK_VERSION) {
    return fail(
      'unsupported-version',
      version > SHARE_LINK_VERSION
        ? `was made by a newer version of Lurk (link format ${version}); this one reads link formats 1 and ${SHARE_LINK_VERSION}. Open it with the newer Lurk`
        : `was made by an older Lurk (link format ${version}) and can no longer be read; ask for a new link`,
    );
  }
  let bytes: Uint8Array;
  try {
    bytes = fromBase64Url(payload);
  } catch {
    return fail('damaged', 'is damaged (it contains characters a share link cannot have); ask for the link again');
  }
  if (checkDigits(bytes) !== check.toLowerCase()) {
    return fail('tampered', 'was changed after it was made, or cut short (its check digits do not match); ask for the link again');
  }
  let json: unknown;
  try {
    const text = version === 1 ? bytes : inflateSync(bytes, { dictionary: dictionaryBytes() });
    json = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(text));
  } catch {
    return fail('damaged', 'is damaged (its contents are not readable); ask for the link again');
  }
  const read = readAppraisal(json);
  if (read.appraisal === null) {
    return { appraisal: null, problems: read.problems.map((p) => inputProblem('link', p.code, `holds an invalid appraisal: ${p.field} ${p.message}`)) };
  }
  return read;
}

let dictionary: Uint8Array | null = null;
function dictionaryBytes(): Uint8Array {
  dictionary ??= new TextEncoder().encode(SHARE_LINK_DICTIONARY);
  return dictionary;
}

function checkDigits(bytes: Uint8Array): string {
  return crc32(bytes).toString(16).padStart(8, '0');
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

