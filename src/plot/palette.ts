/**
 * Lurk's plot colours: chosen from the colour-blind-safe set of Okabe & Ito (2008, "Color Universal Design",
 * J*FLY), with distinct marker shapes and dash patterns so that nothing depends on colour alone.
 */
export const palette = Object.freeze({
  /** The estimate's own curve or point. */
  estimate: '#0072B2',
  /** The interval limit's curve (reddish purple: no figure draws a red line). */
  interval: '#CC79A7',
  /** Shading of the region where the conclusion would change. */
  overturned: '#E69F00',
  /** Reference or benchmark points. */
  reference: '#009E73',
  /** A second series. */
  second: '#56B4E9',
  /** Thresholds (α, the null). */
  threshold: '#56564f',
  /** Axis lines, tick labels and text. */
  ink: '#1f2328',
  /** Grid lines. */
  grid: '#d8dde3',
  /** Contour lines. */
  contour: '#6b7785',
});

/** A sequence for several series, in order of distinguishability. */
export const seriesColors: readonly string[] = Object.freeze(['#0072B2', '#CC79A7', '#009E73', '#E69F00', '#56B4E9', '#000000']);

/** Dash patterns paired with `seriesColors`. */
export const seriesDashes: readonly string[] = Object.freeze(['', '6 3', '2 3', '8 3 2 3', '4 4', '1 2']);

/** Where a conclusion flips (the edge of the shaded region): a solid dark amber line, never a dashed red one. */
export const boundaryColor = '#8a5300';

/**
 * Lurk's marker language, the same in every figure of every method: what a point IS decides its shape and
 * colour. The reported (unadjusted) finding is an open ring; a tipping point of the estimate (E-value,
 * robustness value, tipping Γ) a blue diamond; the tipping point of the interval or of significance a reddish-purple
 * triangle; a benchmark from the data (reference confounder, observed covariate) a green hexagon; a strength the
 * user chose a purple plus; an example from the text a purple circle.
 */
export const markers = Object.freeze({
  reported: Object.freeze({ shape: 'ring' as const, color: palette.ink }),
  tippingEstimate: Object.freeze({ shape: 'diamond' as const, color: palette.estimate }),
  tippingInterval: Object.freeze({ shape: 'triangle' as const, color: palette.interval }),
  benchmark: Object.freeze({ shape: 'hexagon' as const, color: palette.reference }),
  chosen: Object.freeze({ shape: 'cross' as const, color: '#7a4f9e' }),
  example: Object.freeze({ shape: 'circle' as const, color: '#7a4f9e' }),
});
