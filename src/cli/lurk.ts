#!/usr/bin/env node
// Entry point of the `lurk` command (built to dist/cli/lurk.js on install).
import { runLurk } from './main';
import { processIo } from './cliIo';
import { isMainThread } from 'node:worker_threads';

// A worker thread started from the bundle (the weighting bootstrap) loads it for its own task only.
if (isMainThread) runLurk(process.argv.slice(2), processIo()).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    process.stderr.write(`lurk: unexpected failure: ${error instanceof Error ? error.message : String(error)}\n`);
    process.exitCode = 1;
  },
);
