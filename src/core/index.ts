// The numerical core of Lurk: pure functions, no DOM, no I/O. One concept per file.
export * from './inputProblem';
export * from './streamingQr';
export * from './linearModel';
