// The faces (components, the command line) speak of bad input through the methods layer, never the core
// directly: the one problem type, its error and its constructor, as every request reader uses them.
export { InputError, inputProblem, throwIfProblems, type InputProblem } from '../core/inputProblem';
