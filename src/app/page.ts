// The page: registers the elements and decides what to open — a shared link, the work kept from the last visit,
// or the fictional demo study.
import '../../components/index';
import { fictionalStudy } from '../demo/fictionalStudy';
import { readAppraisal, type Appraisal } from '../workspace/appraisal';
import { decodeShareFragment, hasShareFragment } from '../workspace/shareLink';

/** Where the page keeps the current appraisal between visits (this browser only). */
const STORAGE_KEY = 'lurk.appraisal';

const app = document.querySelector('lurk-app');
if (app) start(app);

function start(app: NonNullable<HTMLElementTagNameMap['lurk-app']>): void {
  const kept = readKept();
  if (hasShareFragment(location.hash)) {
    const shared = decodeShareFragment(location.hash);
    if (shared.appraisal) {
      app.load(shared.appraisal);
      app.notice = 'Opened the appraisal from the share link.';
      keep(shared.appraisal);
      history.replaceState(null, '', location.pathname + location.search);
    } else {
      openKeptOrDemo(app, kept);
      app.notice = `This share link ${shared.problems[0].message}. Your current work is kept.`;
    }
  } else {
    openKeptOrDemo(app, kept);
  }
  app.addEventListener('lurk-appraisal-change', (event) => keep(event.detail.appraisal));
}

function openKeptOrDemo(app: NonNullable<HTMLElementTagNameMap['lurk-app']>, kept: Appraisal | null): void {
  if (kept) {
    app.load(kept);
    return;
  }
  const demo = fictionalStudy();
  app.study = demo.study;
  app.inputs = demo.inputs;
  app.banner = demo.banner;
}

function readKept(): Appraisal | null {
  try {
    const text = localStorage.getItem(STORAGE_KEY);
    if (!text) return null;
    return readAppraisal(JSON.parse(text)).appraisal;
  } catch {
    return null;
  }
}

function keep(appraisal: Appraisal): void {
  // Once the work moves on, a share link in the address bar would bring back the old state on reload.
  if (hasShareFragment(location.hash)) history.replaceState(null, '', location.pathname + location.search);
  try {
    localStorage.setItem(STORAGE_KEY, JSON.stringify(appraisal));
  } catch {
    // Storage full or disabled (private mode): the work still lives in the page.
  }
}
