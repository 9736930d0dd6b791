import type { AxisSpec } from './plotSpec';

/** Pixel → data value along an axis (linear or log), the inverse of the axis' mapping. */
export function invertAxis(axis: AxisSpec, pixel: number): number {
  const [d0, d1] = axis.domain;
  const [r0, r1] = axis.range;
  const t = (pixel - r0) / (r1 - r0);
  if (axis.scale === 'log') return Math.exp(Math.log(d0) + t * (Math.log(d1) - Math.log(d0)));
  return d0 + t * (d1 - d0);
}
