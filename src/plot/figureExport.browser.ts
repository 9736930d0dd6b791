import type { PlotSpec } from './plotSpec';
import { layoutFor, renderLayoutSvg } from './svgString';
import { setPngDpi } from './pngDpi';
import { PRINT_SIZES, type PrintWidth } from './printSize';
import { figureCaption, figureCsv } from './figureCaption';

/** One journal column is about 3.5 inches (89 mm) wide; figures export at 300 dpi at that width by default. */
export const COLUMN_WIDTH_INCHES = PRINT_SIZES.column.inches;
export const EXPORT_DPI = 300;
/** The resolutions offered for PNG files. */
export const PNG_RESOLUTIONS: readonly number[] = Object.freeze([300, 600]);

/** The plot as a standalone SVG file sized for print (width in inches, title drawn in). */
export function figureSvgBlob(spec: PlotSpec, print: PrintWidth = 'column'): Blob {
  const layout = layoutFor(spec, { print, includeTitle: true });
  return new Blob([renderLayoutSvg(layout, { widthInches: PRINT_SIZES[print].inches })], { type: 'image/svg+xml' });
}

/**
 * The plot as a PNG at a journal width and resolution (3.5 in at 300 dpi is 1050 pixels wide), with the
 * resolution written into the file's pHYs chunk. Drawn by the browser from the print SVG.
 */
export async function figurePngBlob(spec: PlotSpec, print: PrintWidth = 'column', dpi = EXPORT_DPI): Promise<Blob> {
  const layout = layoutFor(spec, { print, includeTitle: true });
  const inches = PRINT_SIZES[print].inches;
  const svg = renderLayoutSvg(layout, { widthInches: inches });
  const widthPx = Math.round(inches * dpi);
  const heightPx = Math.round((layout.height / layout.width) * widthPx);
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    const image = new Image();
    image.decoding = 'sync';
    await new Promise<void>((resolve, reject) => {
      image.onload = () => resolve();
      image.onerror = () => reject(new Error('the figure could not be drawn'));
      image.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = widthPx;
    canvas.height = heightPx;
    const context = canvas.getContext('2d');
    if (!context) throw new Error('this browser cannot draw figures');
    context.fillStyle = '#ffffff';
    context.fillRect(0, 0, widthPx, heightPx);
    context.drawImage(image, 0, 0, widthPx, heightPx);
    const blob = await new Promise<Blob>((resolve, reject) =>
      canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('the figure could not be encoded'))), 'image/png'),
    );
    const bytes = setPngDpi(new Uint8Array(await blob.arrayBuffer()), dpi);
    return new Blob([bytes as BlobPart], { type: 'image/png' });
  } finally {
    URL.revokeObjectURL(url);
  }
}

/** The figure's data table as a CSV file. */
export function figureCsvBlob(spec: PlotSpec): Blob {
  return new Blob([figureCsv(spec)], { type: 'text/csv' });
}

/** The figure's caption (title, description, numbered key, data pointer) as a text file. */
export function figureCaptionBlob(spec: PlotSpec, print: PrintWidth = 'column'): Blob {
  return new Blob([figureCaption(spec, layoutFor(spec, { print, includeTitle: true }))], { type: 'text/plain' });
}

/** Offers a blob as a download with the given file name. */
export function downloadBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.rel = 'noopener';
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
