import { LitElement, css, html, nothing } from 'lit';
import { customElement, property, state } from 'lit/decorators.js';
import { unsafeSVG } from 'lit/directives/unsafe-svg.js';
import type { PlotSpec } from '../src/plot/plotSpec';
import { layoutFor, renderLayoutSvg } from '../src/plot/svgString';
import type { FigureLayout } from '../src/plot/figureLayout';
import { invertAxis } from '../src/plot/invertAxis';
import { PRINT_SIZES, type PrintWidth } from '../src/plot/printSize';
import { PNG_RESOLUTIONS, downloadBlob, figureCaptionBlob, figureCsvBlob, figurePngBlob, figureSvgBlob } from '../src/plot/figureExport.browser';
import { baseStyles } from './styles/base';

export interface PlotPointerDetail {
  /** Data coordinates under the pointer. */
  x: number;
  y: number;
  /** Whether the pointer is inside the plotting area. */
  inside: boolean;
}

/**
 * @summary Draws one Lurk plot from its PlotSpec, laid out for the width it gets (no overlapping text, text at
 * least 11 CSS px), with its data table as the text alternative and export at journal sizes (SVG in inches,
 * PNG at 300 or 600 dpi, the data as CSV, the caption as text).
 *
 * @property spec - the PlotSpec to draw (from a src/plot function); nothing is drawn while it is null.
 * @property readout - optional text shown under the plot (e.g. values under the pointer), announced politely.
 * @fires lurk-plot-pointer - {x, y, inside} in data coordinates when the pointer moves over the plot.
 * @fires lurk-figure-export - {format: 'svg' | 'png' | 'csv' | 'txt', fileName} after the user exported the figure.
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
 * @cssprop --lurk-plot-max-width - the widest the plot is drawn (default 720px)
 */
@customElement('lurk-plot')
export class LurkPlot extends LitElement {
  static override styles = [
    baseStyles,
    css`
      figure {
        margin: 0;
      }
      :host {
        display: block;
        min-width: 0;
      }
      .svg-holder {
        width: 100%;
        max-width: var(--lurk-plot-max-width, 720px);
      }
      .svg-holder svg {
        max-width: 100%;
        height: auto;
        display: block;
        touch-action: pan-y;
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
      .tools label {
        display: inline-flex;
        gap: 0.3rem;
        align-items: center;
        margin: 0;
        font-size: 0.85rem;
        font-weight: normal;
      }
      .tools select {
        width: auto;
        padding: 0.2rem 0.3rem;
        font-size: 0.85rem;
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
  /** The width the figure is laid out for: the element's own width, at most the maximum. */
  @state() private drawWidth = 0;
  @state() private printWidth: PrintWidth = 'column';
  @state() private dpi = 300;

  private svgMarkup = '';
  private layout: FigureLayout | null = null;
  private resizeObserver: ResizeObserver | null = null;

  override connectedCallback(): void {
    super.connectedCallback();
    this.resizeObserver = new ResizeObserver(() => this.measure());
    this.resizeObserver.observe(this);
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.resizeObserver?.disconnect();
    this.resizeObserver = null;
  }

  private measure(): void {
    const holder = this.renderRoot.querySelector('.svg-holder') as HTMLElement | null;
    const available = Math.floor((holder ?? this).getBoundingClientRect().width);
    if (available > 0 && Math.abs(available - this.drawWidth) >= 1) this.drawWidth = available;
  }

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (changed.has('spec') || changed.has('drawWidth')) {
      const width = this.drawWidth > 0 ? Math.min(this.drawWidth, 720) : Math.min(this.spec?.width ?? 640, 640);
      this.layout = this.spec ? layoutFor(this.spec, { width }) : null;
      this.svgMarkup = this.layout ? renderLayoutSvg(this.layout) : '';
    }
  }

  protected override updated(): void {
    if (this.drawWidth === 0) this.measure();
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
          <label
            >Size
            <select @change=${(e: Event) => (this.printWidth = (e.target as HTMLSelectElement).value as PrintWidth)}>
              ${(Object.keys(PRINT_SIZES) as PrintWidth[]).map((k) => html`<option value=${k} ?selected=${k === this.printWidth}>${PRINT_SIZES[k].label}</option>`)}
            </select></label
          >
          <label
            >PNG resolution
            <select @change=${(e: Event) => (this.dpi = Number((e.target as HTMLSelectElement).value))}>
              ${PNG_RESOLUTIONS.map((d) => html`<option value=${d} ?selected=${d === this.dpi}>${d} dpi</option>`)}
            </select></label
          >
          <button class="secondary" type="button" @click=${() => this.export('svg')} aria-label="Download ${spec.title} as SVG">SVG</button>
          <button class="secondary" type="button" @click=${() => this.export('png')} aria-label="Download ${spec.title} as PNG">PNG</button>
          <button class="secondary" type="button" @click=${() => this.export('csv')} aria-label="Download the data of ${spec.title} as CSV">Data (CSV)</button>
          <button class="secondary" type="button" @click=${() => this.export('txt')} aria-label="Download the caption of ${spec.title} as text">Caption</button>
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
    const layout = this.layout;
    const svg = (event.currentTarget as HTMLElement).querySelector('svg');
    if (!layout || !svg) return;
    const box = svg.getBoundingClientRect();
    if (box.width === 0) return;
    const px = ((event.clientX - box.left) / box.width) * layout.width;
    const py = ((event.clientY - box.top) / box.width) * layout.width;
    const { inner } = layout;
    const inside = px >= inner.left && px <= inner.right && py >= inner.top && py <= inner.bottom;
    const detail: PlotPointerDetail = { x: invertAxis(layout.xAxis, px), y: invertAxis(layout.yAxis, py), inside };
    this.dispatchEvent(new CustomEvent('lurk-plot-pointer', { detail, bubbles: true, composed: true }));
  }

  private onLeave(): void {
    if (!this.spec) return;
    this.dispatchEvent(
      new CustomEvent<PlotPointerDetail>('lurk-plot-pointer', { detail: { x: NaN, y: NaN, inside: false }, bubbles: true, composed: true }),
    );
  }

  private async export(format: 'svg' | 'png' | 'csv' | 'txt'): Promise<void> {
    const spec = this.spec;
    if (!spec) return;
    const size = this.printWidth === 'column' ? '1col' : '2col';
    const fileName =
      format === 'svg' ? `lurk-${spec.id}-${size}.svg` : format === 'png' ? `lurk-${spec.id}-${size}-${this.dpi}dpi.png` : format === 'csv' ? `lurk-${spec.id}.csv` : `lurk-${spec.id}-caption.txt`;
    try {
      const blob =
        format === 'svg'
          ? figureSvgBlob(spec, this.printWidth)
          : format === 'png'
            ? await figurePngBlob(spec, this.printWidth, this.dpi)
            : format === 'csv'
              ? figureCsvBlob(spec)
              : figureCaptionBlob(spec, this.printWidth);
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
    'lurk-figure-export': CustomEvent<{ format: 'svg' | 'png' | 'csv' | 'txt'; fileName: string }>;
  }
}
