// The page: registers the elements and decides what to open — a shared link, the work kept from the last visit,
// or the fictional demo study — without ever losing the work in progress:
// - a visit that did not finish drawing its results (a flag set in local storage before drawing, cleared after)
//   opens the next time with the saved work not yet computed, and says so, with a button to compute it;
// - a share link (on load, or pasted into an open tab) replaces the current work only when the user says so, and
//   the replaced appraisal joins a short list of recent appraisals (this browser only), offered above the app;
// - a reload returns to the tab and the finding the reviewer was on.
import '../../components/index';
import { fictionalAppraisal, fictionalStudy } from '../demo/fictionalStudy';
import { readAppraisal, type Appraisal } from '../workspace/appraisal';
import { decodeShareFragment, hasShareFragment, withoutRawData } from '../workspace/shareLink';

/** Where the page keeps the current appraisal between visits (this browser only). */
const STORAGE_KEY = 'lurk.appraisal';
/** Set while results are drawn; still set at the next visit when that drawing never finished. */
const DRAWING_KEY = 'lurk.drawing';
/** The last few appraisals that were replaced (newest first). */
const RECENT_KEY = 'lurk.recent';
const RECENT_COUNT = 5;
/** The open tab and finding (this browser only), so that a reload returns there. */
const PLACE_KEY = 'lurk.place';

type LurkApp = NonNullable<HTMLElementTagNameMap['lurk-app']>;
interface RecentEntry {
  readonly replacedAt: string;
  readonly appraisal: Appraisal;
}

const app = document.querySelector('lurk-app');
if (app) start(app);

function start(app: LurkApp): void {
  const kept = readKept();
  const interrupted = storageGet(DRAWING_KEY) !== null;
  storageRemove(DRAWING_KEY);
  if (interrupted) openNotComputed(app, kept);
  else if (hasShareFragment(location.hash)) openShared(app, kept);
  else openKeptOrDemo(app, kept);
  returnToPlace(app);
  app.addEventListener('lurk-appraisal-change', (event) => keep(event.detail.appraisal));
  app.addEventListener('lurk-view-change', (event) => storageSet(PLACE_KEY, JSON.stringify(event.detail)));
  // A share link pasted into the address bar of this open tab is handled like one opened from outside.
  window.addEventListener('hashchange', () => {
    if (hasShareFragment(location.hash)) openShared(app, currentWork(app));
  });
  renderRecent(app);
}

/** Whether an appraisal holds anything worth keeping: a finding or a batch table. */
function holdsWork(appraisal: Appraisal): boolean {
  return appraisal.findings.length > 0 || (appraisal.batch?.text ?? '') !== '';
}

/** The work in the page now, or null when it holds nothing worth keeping. */
function currentWork(app: LurkApp): Appraisal | null {
  const work = app.appraisal;
  return holdsWork(work) ? work : readKept();
}

/** Opens the tab and finding of the last visit, where they still exist. */
function returnToPlace(app: LurkApp): void {
  try {
    const place: unknown = JSON.parse(storageGet(PLACE_KEY) ?? 'null');
    if (place && typeof place === 'object' && typeof (place as { view?: unknown }).view === 'string') {
      const { view, finding } = place as { view: string; finding?: unknown };
      app.place = { view, finding: typeof finding === 'string' ? finding : '' };
    }
  } catch {
    // A damaged note of the last place: start on the first tab.
  }
}

/** Draws an appraisal, with the drawing flag set until the page has painted its results. */
function draw(app: LurkApp, appraisal: Appraisal): void {
  storageSet(DRAWING_KEY, new Date().toISOString());
  app.banner = '';
  app.load(appraisal);
  void app.updateComplete.then(
    () =>
      requestAnimationFrame(() =>
        requestAnimationFrame(() => {
          storageRemove(DRAWING_KEY);
        }),
      ),
  );
}

/** The last visit stopped while drawing: the saved work is kept (and in the recent list) but not computed. */
function openNotComputed(app: LurkApp, kept: Appraisal | null): void {
  if (!kept) {
    openDemo(app);
    return;
  }
  remember(kept);
  app.study = kept.study;
  showChoice(
    'The last visit stopped before its results were drawn, so your saved work is open but not computed yet.',
    [
      { label: 'Compute the saved work', action: () => draw(app, kept) },
      { label: 'Leave it', action: () => undefined },
    ],
  );
}

function openShared(app: LurkApp, current: Appraisal | null): void {
  const shared = decodeShareFragment(location.hash);
  if (!shared.appraisal) {
    clearFragment();
    if (!app.hasUpdated && !holdsWork(app.appraisal)) openKeptOrDemo(app, current);
    app.notice = `This share link ${shared.problems[0].message}. Your current work is kept.`;
    return;
  }
  const incoming = shared.appraisal;
  const open = () => {
    if (current) remember(current);
    clearFragment();
    draw(app, incoming);
    keep(incoming);
    app.notice = current ? 'Opened the appraisal from the share link; your previous work is under “Recent appraisals”.' : 'Opened the appraisal from the share link.';
    renderRecent(app);
  };
  if (!current) {
    open();
    return;
  }
  if (sameWork(current, incoming)) {
    // The link holds this very work (e.g. reloaded after "Copy share link"): keep the local copy, which may also
    // hold raw data rows that a link never carries.
    clearFragment();
    if (!holdsWork(app.appraisal)) draw(app, current);
    return;
  }
  // Keep showing the work in progress while asking.
  if (!holdsWork(app.appraisal)) draw(app, current);
  showChoice(`This share link carries an appraisal (${describe(incoming)}). Open it in place of your current work (${describe(current)})?`, [
    { label: 'Open the shared appraisal', action: open },
    {
      label: 'Keep my work',
      action: () => {
        clearFragment();
        app.notice = 'Kept your current work; the share link was not opened.';
      },
    },
  ]);
}

function openKeptOrDemo(app: LurkApp, kept: Appraisal | null): void {
  if (kept) draw(app, kept);
  else openDemo(app);
}

function openDemo(app: LurkApp): void {
  app.load(fictionalAppraisal());
  app.banner = fictionalStudy().banner;
}

/**
 * Whether two appraisals hold the same work: labels, findings (names, methods, inputs) and the batch table, leaving
 * aside the time of saving, the results and raw data rows (which a share link never carries).
 */
function sameWork(a: Appraisal, b: Appraisal): boolean {
  const work = (x: Appraisal) => {
    const findings = withoutRawData(x).findings.map((f) => [f.id, f.method, f.name, sortedKeys(f.inputs)]);
    return JSON.stringify([x.study, findings, x.batch?.text ?? '', x.batch?.alpha ?? '0.05']);
  };
  return work(a) === work(b);
}

/** A copy with object keys in sorted order, so that two equal forms compare equal as text. */
function sortedKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortedKeys);
  if (value === null || typeof value !== 'object') return value;
  return Object.fromEntries(Object.keys(value).sort().map((k) => [k, sortedKeys((value as Record<string, unknown>)[k])]));
}

/** A short name for an appraisal: its study's finding, or the names of its findings. */
function describe(appraisal: Appraisal): string {
  const finding = appraisal.study.finding.trim();
  const label = finding !== '' ? `“${finding}”` : appraisal.findings.map((f) => `“${f.name}”`).join(', ') || 'empty';
  return label.length > 80 ? `${label.slice(0, 79)}…` : label;
}

/** A notice above the app with a message and buttons; it goes away when a button is pressed. */
function showChoice(message: string, choices: readonly { label: string; action: () => void }[]): void {
  document.querySelector('.page-notice')?.remove();
  const box = document.createElement('div');
  box.className = 'page-notice';
  box.setAttribute('role', 'alertdialog');
  box.setAttribute('aria-label', 'Before opening');
  const text = document.createElement('p');
  text.textContent = message;
  box.append(text);
  for (const choice of choices) {
    const button = document.createElement('button');
    button.type = 'button';
    button.textContent = choice.label;
    button.addEventListener('click', () => {
      box.remove();
      choice.action();
    });
    box.append(button);
  }
  document.querySelector('main')?.prepend(box);
  box.querySelector('button')?.focus();
}

/** The recent appraisals, offered above the app: reopening one keeps the current work in the list too. */
function renderRecent(app: LurkApp): void {
  document.querySelector('.recent-appraisals')?.remove();
  const recent = readRecent();
  if (recent.length === 0) return;
  const details = document.createElement('details');
  details.className = 'recent-appraisals';
  const summary = document.createElement('summary');
  summary.textContent = `Recent appraisals (${recent.length})`;
  const list = document.createElement('ul');
  for (const entry of recent) {
    const item = document.createElement('li');
    const button = document.createElement('button');
    button.type = 'button';
    button.textContent = `${describe(entry.appraisal)} — replaced ${new Date(entry.replacedAt).toLocaleString()}`;
    button.addEventListener('click', () => {
      const current = currentWork(app);
      if (current && !sameWork(current, entry.appraisal)) remember(current);
      draw(app, entry.appraisal);
      keep(entry.appraisal);
      app.notice = `Reopened ${describe(entry.appraisal)}.`;
      renderRecent(app);
    });
    item.append(button);
    list.append(item);
  }
  details.append(summary, list);
  document.querySelector('main')?.prepend(details);
}

function remember(appraisal: Appraisal): void {
  const recent = readRecent().filter((entry) => !sameWork(entry.appraisal, appraisal));
  recent.unshift({ replacedAt: new Date().toISOString(), appraisal });
  storageSet(RECENT_KEY, JSON.stringify(recent.slice(0, RECENT_COUNT)));
}

function readRecent(): RecentEntry[] {
  try {
    const list: unknown = JSON.parse(storageGet(RECENT_KEY) ?? '[]');
    if (!Array.isArray(list)) return [];
    const out: RecentEntry[] = [];
    for (const item of list.slice(0, RECENT_COUNT)) {
      const appraisal = readAppraisal(item?.appraisal).appraisal;
      if (appraisal && typeof item.replacedAt === 'string') out.push({ replacedAt: item.replacedAt, appraisal });
    }
    return out;
  } catch {
    return [];
  }
}

function readKept(): Appraisal | null {
  try {
    const text = storageGet(STORAGE_KEY);
    if (!text) return null;
    return readAppraisal(JSON.parse(text)).appraisal;
  } catch {
    return null;
  }
}

function keep(appraisal: Appraisal): void {
  // Once the work moves on, a share link in the address bar would bring back the old state on reload.
  if (hasShareFragment(location.hash)) clearFragment();
  storageSet(STORAGE_KEY, JSON.stringify(appraisal));
}

function clearFragment(): void {
  history.replaceState(null, '', location.pathname + location.search);
}

// Storage may be full or disabled (private mode): the work still lives in the page.
function storageGet(key: string): string | null {
  try {
    return localStorage.getItem(key);
  } catch {
    return null;
  }
}
function storageSet(key: string, value: string): void {
  try {
    localStorage.setItem(key, value);
  } catch {
    // Nothing to do: see above.
  }
}
function storageRemove(key: string): void {
  try {
    localStorage.removeItem(key);
  } catch {
    // Nothing to do: see above.
  }
}
