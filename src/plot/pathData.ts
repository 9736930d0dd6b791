import { line } from 'd3-shape';

/**
 * SVG path data through pixel points, breaking the line wherever a point is not finite
 * (so a curve that leaves the domain is never joined across the gap). d3-shape draws the segments.
 */
export function polylinePath(points: ReadonlyArray<readonly [number, number]>): string {
  const generator = line<readonly [number, number]>()
    .defined((p) => Number.isFinite(p[0]) && Number.isFinite(p[1]))
    .x((p) => p[0])
    .y((p) => p[1])
    .digits(2);
  return generator(points) ?? '';
}

/** A closed polygon through pixel points (non-finite points are dropped). */
export function polygonPath(points: ReadonlyArray<readonly [number, number]>): string {
  const finite = points.filter((p) => Number.isFinite(p[0]) && Number.isFinite(p[1]));
  if (finite.length < 3) return '';
  return `M${finite.map((p) => `${round(p[0])},${round(p[1])}`).join('L')}Z`;
}

function round(v: number): number {
  return Math.round(v * 100) / 100;
}
