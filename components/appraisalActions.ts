import { readAppraisal, type Appraisal } from '../src/workspace/appraisal';
import { encodeShareFragment, shareLinkLength } from '../src/workspace/shareLink';
import { appraisalFileName } from '../src/workspace/findingList';
import { downloadBlob } from '../src/plot/figureExport.browser';

/** What the workspace's toolbar does with files and links, apart from the element: each returns the notice to show. */

/** Downloads the appraisal as JSON, named after the study (or its only finding). */
export function saveAppraisalFile(appraisal: Appraisal): string {
  const name = appraisalFileName(appraisal);
  downloadBlob(new Blob([JSON.stringify(appraisal, null, 2) + '\n'], { type: 'application/json' }), name);
  return `Saved the appraisal as ${name} (inputs and results of every finding, and the batch table; raw data files are not included).`;
}

/** Reads a chosen file: the appraisal and the notice, or only the notice of why it cannot be opened. */
export async function readAppraisalFile(file: File): Promise<{ appraisal: Appraisal | null; notice: string }> {
  let json: unknown;
  try {
    json = JSON.parse(await file.text());
  } catch {
    return { appraisal: null, notice: `"${file.name}" is not a JSON file; your current work is kept.` };
  }
  const read = readAppraisal(json);
  if (read.appraisal === null) {
    const p = read.problems[0];
    return { appraisal: null, notice: `"${file.name}" cannot be opened: ${p.field} ${p.message}. Your current work is kept.` };
  }
  const count = read.appraisal.findings.length;
  return { appraisal: read.appraisal, notice: `Opened "${file.name}" (${count} finding${count === 1 ? '' : 's'}).` };
}

/** Puts the share link in the address bar and on the clipboard; says plainly when it is too long for e-mail and chat. */
export async function shareAppraisal(appraisal: Appraisal): Promise<string> {
  const url = `${location.origin}${location.pathname}${encodeShareFragment(appraisal)}`;
  history.replaceState(null, '', url);
  const length = shareLinkLength(url);
  let said = 'Share link copied.';
  try {
    await navigator.clipboard.writeText(url);
  } catch {
    said = 'Share link placed in the address bar (copying is not allowed here).';
  }
  return length.tooLong ? `${said} ${length.message}` : `${said} It carries your inputs, never raw data rows; anyone with it sees the same appraisal.`;
}
