import type { CommandFigure, CommandReport, OptionSpec, OptionValues } from '../methods/methodModule';
import { fieldReader } from '../methods/fieldReader';
import { PRINT_SIZES, type PrintWidth } from '../plot/printSize';
import { renderSvgString } from '../plot/svgString';
import { UsageError } from './usageError';

/**
 * Every calculator command prints its figures the same way: `--svg NAME` writes one figure as an SVG document
 * to standard output instead of the report (`--svg NAME > figure.svg`), laid out for a journal width
 * (`--svg-width column|two-columns`): sized in inches, one drawing unit per point, text at least 7 pt.
 */
export const FIGURE_OPTIONS: Readonly<Record<string, OptionSpec>> = Object.freeze({
  svg: { type: 'string' },
  'svg-width': { type: 'string' },
});

const WIDTHS = ['column', 'two-columns'] as const satisfies readonly PrintWidth[];

/** Which figure to print and at which width. */
export interface FigureRequest {
  readonly figure: CommandFigure;
  readonly width: PrintWidth;
}

/**
 * The figure asked for with --svg (null when none), read before the analysis runs. Refused naming the option:
 * a name that is not one of the command's figures (the message lists them), --svg with --json, and
 * --svg-width without --svg or with a width that is not offered.
 */
export function readFigureRequest(values: OptionValues, figures: readonly CommandFigure[]): FigureRequest | null {
  const reader = fieldReader();
  const asked = values.svg;
  const width = values['svg-width'];
  if (asked === undefined) {
    if (width !== undefined) throw new UsageError('--svg-width', 'needs --svg FIGURE (it sets the width of the SVG)');
    return null;
  }
  if (typeof asked !== 'string' || asked.trim() === '') throw new UsageError('--svg', `needs a figure: one of ${figures.map((f) => f.name).join(', ')}`);
  const name = reader.choice('--svg', asked, figures.map((f) => f.name));
  const print = typeof width === 'string' ? reader.choice('--svg-width', width, WIDTHS) : 'column';
  const problem = reader.problems[0];
  if (problem) throw new UsageError(problem.field, problem.message);
  if (values.json) throw new UsageError('--svg', 'cannot be combined with --json (the SVG is the output; redirect it: --svg NAME > figure.svg)');
  return { figure: figures.find((f) => f.name === name)!, width: print ?? 'column' };
}

/** The SVG document of the figure asked for, from the report's figures; refused naming --svg when it has none. */
export function figureSvg(report: CommandReport, request: FigureRequest): string {
  const { figure, width } = request;
  const build = report.figures?.[figure.name];
  if (!build) throw new UsageError('--svg', 'these options print no analysis, so there is no figure to draw (e.g. --sql prints a query)');
  const spec = build();
  if (!spec) throw new UsageError('--svg', `this result has no ${figure.name} figure${figure.absentWhen ? ` (none when ${figure.absentWhen})` : ''}`);
  return renderSvgString(spec, { print: width, includeTitle: true }) + '\n';
}

/** The help section listing a command's figures and the two options (added to every calculator's --help). */
export function figureHelp(command: string, figures: readonly CommandFigure[]): string {
  const pad = Math.max(12, ...figures.map((f) => f.name.length + 2));
  const lines = [
    'Figures (the ones the page draws), one at a time as SVG on standard output instead of the report:',
    `  --svg FIGURE    one of ${figures.map((f) => f.name).join(', ')}:`,
    ...figures.map((f) => wrap(`      ${f.name.padEnd(pad)}`, `${f.shows}${f.absentWhen ? ` (none when ${f.absentWhen})` : ''}`)),
    wrap('  --svg-width W   ', `${WIDTHS.map((w) => `${w} (${PRINT_SIZES[w].inches} in)`).join(' or ')}, default column: the journal width. The SVG is sized in inches (one unit per point), text at least 7 pt, lines at least 0.5 pt.`),
    `  e.g. lurk ${command} … --svg ${figures[0]?.name ?? 'FIGURE'} > figure.svg      (--svg cannot be combined with --json)`,
  ];
  return lines.join('\n') + '\n';
}

/** `lead` then `text`, wrapped at 112 characters, the continuation lines indented under the text. */
function wrap(lead: string, text: string): string {
  const lines: string[] = [];
  let line = lead;
  for (const word of text.split(' ')) {
    if (line.length + word.length + 1 > 112 && line.trim() !== lead.trim()) {
      lines.push(line.trimEnd());
      line = ' '.repeat(lead.length);
    }
    line += (line.endsWith(' ') ? '' : ' ') + word;
  }
  return [...lines, line].join('\n');
}
