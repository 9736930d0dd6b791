#!/usr/bin/env node
// Entry point of the `lurk` command (built to dist/cli/lurk.js on install).
import { runLurk } from './main';
import { processIo } from './cliIo';

runLurk(process.argv.slice(2), processIo()).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    process.stderr.write(`lurk: unexpected failure: ${error instanceof Error ? error.message : String(error)}\n`);
    process.exitCode = 1;
  },
);
