/**
 * Lurk as a typed library: each method's request reader (typed text → typed input and problems by field),
 * its runner, and the core analyses with their types; the registry of methods; the workspace (appraisal files,
 * share links, the robustness statement, the bottom line, batch appraisal); and the one number reader.
 *
 * A request reader takes the form as typed (text, as a page form, a command line, a batch row or a share link
 * holds it) and returns `{ result, problems, started }`; the core analyses take typed numbers and throw
 * `InputError` with every problem. Results are frozen, self-describing objects.
 */

// The numerical core: every analysis, its input and result types, and the kernels.
export * from './core/index';

// The one reading of typed text.
export { readTypedNumber, NUMBER_READING_RULE, type NumberKind, type TypedNumber } from './data/numberText';
export { readCsvText, type CsvTable } from './data/csv';
export { readCsvRows, csvRowBatches } from './data/csvStream';

// The registry of methods and the contract each method fulfils.
export { METHODS, methodById, methodByCommand } from './methods/registry';
export type { MethodModule, MethodOutcome, MethodSummary, FormKit, CommandKit, CommandFigure, CommandReport, WorkspaceKit, StatementPart, BottomLinePart, FileSource } from './methods/methodModule';
// The shape of `reading` in every command's JSON output.
export type { JsonReading } from './methods/jsonReading';

// E-value: request reader, runner, module.
export { emptyEValueForm, normaliseEValueForm, evaluateEValueForm, type EValueFormInputs, type EValueFormOutcome } from './methods/evalue/request';
export { runEValue, type EValueRun } from './methods/evalue/runner';
export { twoByTwoFromCsv } from './methods/evalue/twoByTwoFromCsv';
export { twoByTwoSql, twoByTwoFromSqlRow } from './methods/evalue/twoByTwoSql';
export { evalueMethod } from './methods/evalue/method';

// Matched pairs: request reader, runner (without and with a Web Worker), module.
export { emptyPairsForm, normalisePairsForm, pairsInputFromForm, type PairsFormInputs } from './methods/pairs/request';
export { analysePairsForm, planPairs, runPairsPlan, type PairsOutcome, type PairsPlan } from './methods/pairs/runner';
export { pairsSql, pairsSummaryFromSqlRow } from './methods/pairs/pairsSql';
export { pairsMethod } from './methods/pairs/method';

// Matched sets (one treated unit, one or more controls): request reader, runner, module.
export { emptySetsForm, normaliseSetsForm, setsInputFromForm, type SetsFormInputs } from './methods/sets/request';
export { analyseSetsForm, planSets, runSetsPlan } from './methods/sets/runner';
export { setsFromCsvText, setsFromCsvStream } from './methods/sets/setsFromCsv';
export { setsMethod } from './methods/sets/method';

// Regression (omitted-variable bias): request reader, data readers, summary-statistics SQL, module.
export { emptyOvbForm, normaliseOvbForm, evaluateOvbForm, type OvbFormInputs, type OvbFormOutcome } from './methods/regression/request';
export { regressionDataFromText, accumulateRegressionFromStream, type RegressionData } from './methods/regression/regressionData';
export { summaryStatisticsSql, crossProductsFromSqlRow } from './methods/regression/summaryStatisticsSql';
export { regressionMethod } from './methods/regression/method';

// Weighting (marginal sensitivity model): request reader, runner (a Web Worker on the page), module.
export { emptyWeightingForm, normaliseWeightingForm, readWeightingSettings, type WeightingFormInputs } from './methods/weighting/request';
export { planWeighting, runWeightingPlan, analyseWeightingStream } from './methods/weighting/runner';
export { weightingMethod } from './methods/weighting/method';

// The workspace.
export { createAppraisal, readAppraisal, type Appraisal, type Finding, type BatchTable } from './workspace/appraisal';
export { encodeShareFragment, decodeShareFragment, shareLinkLength, SHARE_LINK_LIMIT } from './workspace/shareLink';
export { buildRobustnessStatement, renderRobustnessStatement, type RobustnessStatement, type StatementFormat } from './workspace/robustnessStatement';
export { buildBottomLine, type BottomLine } from './workspace/bottomLine';
export { appraiseBatchCsv, type BatchResult, type BatchRow } from './workspace/batchFindings';
