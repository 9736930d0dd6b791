// Text in, text out: parsing, CSV reading, formatting and exports.
export * from './parseNumberText';
export * from './csv';
export * from './formatNumber';
export * from './studyLabels';
export * from './csvChunkReader';
export * from './regressionData';
export * from './summaryStatisticsSql';
export * from './twoByTwoFromCsv';
export * from './eValueText';
export * from './missingCell';
export * from './ovbRegressionData';
export * from './pairsFromCsv';
export * from './pairsFromText';
export * from './pairsText';
export * from './ovbText';
export * from './eValueForm';
export * from './decimalSpan';
