// One module that registers every Lurk element on a page: <script type="module" src=".../lurk.js">.
export { LurkPlot } from './lurk-plot';
export { LurkStudy } from './lurk-study';
export { LurkApp } from './lurk-app';
