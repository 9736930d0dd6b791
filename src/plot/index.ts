// Plots as plain data (PlotSpec), built by pure functions, drawn by renderSvgString and <lurk-plot>.
export * from './plotSpec';
export * from './frame';
export * from './palette';
export * from './svgString';
export * from './pathData';
export * from './invertAxis';
export * from './figureLayout';
export * from './printSize';
export * from './tickLabels';
export * from './textMeasure';
export * from './figureCaption';
