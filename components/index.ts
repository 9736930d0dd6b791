// One module that registers every Lurk element on a page: <script type="module" src=".../lurk-components.js">.
export { LurkPlot } from './lurk-plot';
export { LurkStudy } from './lurk-study';
export { LurkFindings } from './lurk-findings';
export { LurkEValue } from './lurk-evalue';
export { LurkStatement } from './lurk-statement';
export { LurkBottomLine } from './lurk-bottom-line';
export { LurkBatch } from './lurk-batch';
export { LurkApp } from './lurk-app';
export { LurkPairs } from './lurk-pairs';
export { LurkSets } from './lurk-sets';
export { LurkOvb } from './lurk-ovb';
export { LurkWeighting } from './lurk-weighting';
