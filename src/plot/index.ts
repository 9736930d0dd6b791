// Plots as plain data (PlotSpec), built by pure functions, drawn by renderSvgString and <lurk-plot>.
export * from './plotSpec';
export * from './frame';
export * from './palette';
export * from './svgString';
export * from './pathData';
export * from './invertAxis';
export * from './jointStrengthPlot';
export * from './pValueByGammaPlot';
export * from './estimateRangePlot';
export * from './amplificationPlot';
export * from './ovbExtremeScenarioPlot';
export * from './ovbContourPlot';
