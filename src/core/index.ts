// The numerical core of Lurk: pure functions, no DOM, no I/O. One concept per file.
export * from './inputProblem';
export * from './streamingQr';
export * from './linearModel';
export * from './confidenceZ';
export * from './eValue';
export * from './boundingFactor';
export * from './riskRatioScale';
export * from './twoByTwo';
export * from './eValueAnalysis';
export * from './referenceConfounder';
export * from './crossProductFit';
export * from './studentT';
export * from './robustnessValue';
export * from './confounderAdjustment';
export * from './benchmarkBounds';
export * from './flipBoundary';
export * from './ovbAnalysis';
