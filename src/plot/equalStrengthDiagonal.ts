import type { Frame } from './frame';
import { palette } from './palette';
import type { RuleMark } from './plotSpec';

/**
 * The dotted diagonal from (1, 1) to (top, top) on a plot of two strengths against each other: where the
 * hidden confounder's link to the one equals its link to the other.
 */
export function equalStrengthDiagonal(frame: Frame, top: number, label: string): RuleMark {
  return {
    kind: 'rule',
    x1: frame.x(1),
    y1: frame.y(1),
    x2: frame.x(top),
    y2: frame.y(top),
    stroke: palette.contour,
    strokeWidth: 1,
    dash: '2 4',
    label,
  };
}
