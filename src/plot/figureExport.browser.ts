import type { PlotSpec } from './plotSpec';
import { renderSvgString, renderedHeight } from './svgString';
import { setPngDpi } from './pngDpi';

/** One journal column is about 3.5 inches (89 mm) wide; figures export at 300 dpi at that width. */
export const COLUMN_WIDTH_INCHES = 3.5;
export const EXPORT_DPI = 300;

/** The plot as a standalone SVG file (title drawn in). */
export function figureSvgBlob(spec: PlotSpec): Blob {
  return new Blob([renderSvgString(spec, { includeTitle: true })], { type: 'image/svg+xml' });
}

/**
 * The plot as a PNG of one journal column width at 300 dpi (1050 pixels wide), with the resolution written
 * into the file. Drawn by the browser from the same SVG.
 */
export async function figurePngBlob(spec: PlotSpec): Promise<Blob> {
  const svg = renderSvgString(spec, { includeTitle: true });
  const widthPx = Math.round(COLUMN_WIDTH_INCHES * EXPORT_DPI);
  const scale = widthPx / spec.width;
  const heightPx = Math.round(renderedHeight(spec, { includeTitle: true }) * scale);
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
    const bytes = setPngDpi(new Uint8Array(await blob.arrayBuffer()), EXPORT_DPI);
    return new Blob([bytes as BlobPart], { type: 'image/png' });
  } finally {
    URL.revokeObjectURL(url);
  }
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
