import { LitElement, css, html, nothing } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { unsafeSVG } from 'lit/directives/unsafe-svg.js';
import type { PlotSpec } from '../src/plot/plotSpec';
import { renderSvgString } from '../src/plot/svgString';
import { invertAxis } from '../src/plot/invertAxis';
import { downloadBlob, figurePngBlob, figureSvgBlob } from '../src/plot/figureExport.browser';
import { baseStyles } from './styles/base';

export interface PlotPointerDetail {
  /** Data coordinates under the pointer. */
  x: number;
  y: number;
  /** Whether the pointer is inside the plotting area. */
  inside: boolean;
}

/**
 * @summary Draws one Lurk plot from its PlotSpec, with its data table as the text alternative and SVG/PNG export.
 *
 * @property spec - the PlotSpec to draw (from a src/plot function); nothing is drawn while it is null.
 * @property readout - optional text shown under the plot (e.g. values under the pointer), announced politely.
 * @fires lurk-plot-pointer - {x, y, inside} in data coordinates when the pointer moves over the plot.
 * @fires lurk-figure-export - {format: 'svg' | 'png', fileName} after the user exported the figure.
 * @csspart figure - the figure element holding the SVG.
 * @csspart table - the data table.
 * @cssprop --lurk-font - font family
 * @cssprop --lurk-text - text colour
 * @cssprop --lurk-muted - colour of hints and secondary text
 * @cssprop --lurk-bg - background of inputs and panels
 * @cssprop --lurk-surface - background of result cards and notes
 * @cssprop --lurk-border - border colour
 * @cssprop --lurk-accent - colour of buttons, links and the selected tab
 * @cssprop --lurk-accent-text - text on the accent colour
 * @cssprop --lurk-error - colour of error messages and invalid fields
 * @cssprop --lurk-warning-bg - background of warnings
 * @cssprop --lurk-focus - focus outline colour
 * @cssprop --lurk-radius - corner radius
 * @cssprop --lurk-plot-max-width - the widest the plot is drawn (default 640px)
 */
@customElement('lurk-plot')
export class LurkPlot extends LitElement {
  static override styles = [
    baseStyles,
    css`
      figure {
        margin: 0;
      }
      .svg-holder {
        width: 100%;
        max-width: var(--lurk-plot-max-width, 640px);
      }
      .svg-holder svg {
        width: 100%;
        height: auto;
        display: block;
        touch-action: none;
      }
      figcaption {
        font-weight: 600;
        margin-bottom: 0.25rem;
      }
      .tools {
        display: flex;
        flex-wrap: wrap;
        gap: 0.5rem;
        align-items: center;
        margin-top: 0.35rem;
      }
      .tools button {
        padding: 0.25rem 0.6rem;
        font-size: 0.85rem;
        min-height: 2rem;
      }
      .readout {
        min-height: 1.3em;
        font-size: 0.9rem;
        color: var(--_muted);
      }
      details {
        margin-top: 0.35rem;
      }
      summary {
        cursor: pointer;
        font-size: 0.9rem;
        color: var(--_accent);
      }
    `,
  ];

  @property({ attribute: false }) spec: PlotSpec | null = null;
  @property() readout = '';

  @state() private exportMessage = '';

  private svgMarkup = '';

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (changed.has('spec')) this.svgMarkup = this.spec ? renderSvgString(this.spec) : '';
  }

  override render() {
    const spec = this.spec;
    if (!spec) return nothing;
    return html`
      <figure part="figure">
        <figcaption id="caption">${spec.title}</figcaption>
        <div class="svg-holder" @pointermove=${this.onPointer} @pointerleave=${this.onLeave}>${unsafeSVG(this.svgMarkup)}</div>
        <div class="readout" aria-live="polite">${this.readout}</div>
        <div class="tools">
          <button class="secondary" type="button" @click=${() => this.export('svg')} aria-label="Download ${spec.title} as SVG">SVG</button>
          <button class="secondary" type="button" @click=${() => this.export('png')} aria-label="Download ${spec.title} as PNG, 300 dpi">PNG (300 dpi)</button>
          <span class="hint" role="status">${this.exportMessage}</span>
        </div>
        <details>
          <summary>Data table for this figure</summary>
          <div class="table-scroll" tabindex="0" role="region" aria-label="Figure data (scrolls sideways)">
            <table part="table">
              <caption class="visually-hidden">${spec.table.caption}</caption>
              <thead>
                <tr>${spec.table.columns.map((c) => html`<th scope="col">${c}</th>`)}</tr>
              </thead>
              <tbody>
                ${spec.table.rows.map((row) => html`<tr>${row.map((cell) => html`<td>${cell}</td>`)}</tr>`)}
              </tbody>
            </table>
          </div>
        </details>
      </figure>
    `;
  }

  private onPointer(event: PointerEvent): void {
    const spec = this.spec;
    const svg = (event.currentTarget as HTMLElement).querySelector('svg');
    if (!spec || !svg) return;
    const box = svg.getBoundingClientRect();
    if (box.width === 0) return;
    const px = ((event.clientX - box.left) / box.width) * spec.width;
    const py = ((event.clientY - box.top) / box.width) * spec.width;
    const { inner } = spec;
    const inside = px >= inner.left && px <= inner.right && py >= inner.top && py <= inner.bottom;
    const detail: PlotPointerDetail = { x: invertAxis(spec.xAxis, px), y: invertAxis(spec.yAxis, py), inside };
    this.dispatchEvent(new CustomEvent('lurk-plot-pointer', { detail, bubbles: true, composed: true }));
  }

  private onLeave(): void {
    if (!this.spec) return;
    this.dispatchEvent(
      new CustomEvent<PlotPointerDetail>('lurk-plot-pointer', { detail: { x: NaN, y: NaN, inside: false }, bubbles: true, composed: true }),
    );
  }

  private async export(format: 'svg' | 'png'): Promise<void> {
    const spec = this.spec;
    if (!spec) return;
    const fileName = `lurk-${spec.id}.${format}`;
    try {
      const blob = format === 'svg' ? figureSvgBlob(spec) : await figurePngBlob(spec);
      downloadBlob(blob, fileName);
      this.exportMessage = `Saved ${fileName}`;
      this.dispatchEvent(new CustomEvent('lurk-figure-export', { detail: { format, fileName }, bubbles: true, composed: true }));
    } catch (error) {
      this.exportMessage = error instanceof Error ? error.message : 'the figure could not be saved';
    }
  }
}

declare global {
  interface HTMLElementTagNameMap {
    'lurk-plot': LurkPlot;
  }
  interface GlobalEventHandlersEventMap {
    'lurk-plot-pointer': CustomEvent<PlotPointerDetail>;
    'lurk-figure-export': CustomEvent<{ format: 'svg' | 'png'; fileName: string }>;
  }
}
