import { page } from 'vitest/browser';

/** A lit element as the browser tests see it. */
type UpdatingElement = HTMLElement & { updateComplete: Promise<unknown> };

/** An event the element fired, with its detail. */
export interface RecordedEvent {
  type: string;
  detail: any;
}

/** The calculator events the browser tests record (fired on user edits and on new results). */
const RECORDED_EVENTS = ['lurk-inputs-change', 'lurk-result'];

/**
 * Sets the viewport, creates `tag`, lets `configure` set its properties, records its calculator events,
 * attaches it to the page and waits for its first render.
 */
export async function mountElement<T extends UpdatingElement>(
  tag: string,
  options: { viewport: { width: number; height: number }; configure?: (element: T) => void },
): Promise<{ element: T; events: RecordedEvent[] }> {
  await page.viewport(options.viewport.width, options.viewport.height);
  const element = document.createElement(tag) as T;
  options.configure?.(element);
  const events: RecordedEvent[] = [];
  for (const type of RECORDED_EVENTS) element.addEventListener(type, (e) => events.push({ type, detail: (e as CustomEvent).detail }));
  document.body.append(element);
  await element.updateComplete;
  return { element, events };
}

/** The text of the first element matching `selector` in the shadow root, whitespace collapsed ('' if none). */
export function shadowText(element: HTMLElement, selector: string): string {
  return (element.shadowRoot?.querySelector(selector)?.textContent ?? '').replace(/\s+/g, ' ').trim();
}

/**
 * Waits for the element and then every `<lurk-plot>` in its shadow root to finish rendering, `rounds` times
 * (a plot that renders can make the element render again).
 */
export async function settleElement(element: UpdatingElement, rounds = 1): Promise<void> {
  for (let i = 0; i < rounds; i++) {
    await element.updateComplete;
    for (const plot of element.shadowRoot?.querySelectorAll('lurk-plot') ?? []) await (plot as UpdatingElement).updateComplete;
  }
}

/** Polls `check` every `pollMs` until it holds (failing after `timeoutMs`), then lets `settle` finish rendering. */
export async function waitUntil(check: () => boolean, settle: () => Promise<void>, timeoutMs: number, pollMs: number): Promise<void> {
  const start = performance.now();
  while (!check()) {
    if (performance.now() - start > timeoutMs) throw new Error('timed out waiting for the page');
    await new Promise((r) => setTimeout(r, pollMs));
  }
  await settle();
}
