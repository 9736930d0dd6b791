// The full regression result from a CSV of 1,000,000 rows × 12 numeric columns (invented data), as whole
// processes: `lurk ovb --file … --json` (the built command) against R base `read.csv` + `lm` on the same file.
// Goal: Lurk at least 2× faster. R runs only where `Rscript` is installed (Debian: apt-get install r-base-core);
// elsewhere that case is skipped and says so. Run: npx vitest bench --run --project unit bench/regressionVersusR.bench.ts
import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, bench, describe } from 'vitest';
import { buildCliForTest } from '../test/support/builtCli';
import { BENCH_COLUMNS, benchCsv } from './regressionFixture';

const ROWS = 1_000_000;
const path = await benchCsv(ROWS);
const hasR = spawnSync('Rscript', ['--version'], { encoding: 'utf8' }).status === 0;
const options = { iterations: 3, warmupIterations: 1, time: 0 };
let cli: Awaited<ReturnType<typeof buildCliForTest>>;

beforeAll(async () => {
  cli = await buildCliForTest();
  if (!hasR) console.log('\nRscript is not installed: the R base comparison is skipped (apt-get install r-base-core to run it).');
}, 120_000);
afterAll(() => cli?.remove());

const formula = `outcome ~ ${BENCH_COLUMNS.slice(1).join(' + ')}`;

describe(`whole process, ${ROWS.toLocaleString('en')} rows × 12 columns to the regression result`, () => {
  bench(
    'lurk ovb --file … --json (node dist/cli/lurk.js)',
    () => {
      const run = spawnSync('node', [cli.lurk, 'ovb', '--file', path, '--outcome', 'outcome', '--treatment', 'treatment', '--json'], { encoding: 'utf8', maxBuffer: 1 << 26 });
      if (run.status !== 0) throw new Error(run.stderr);
    },
    options,
  );
  bench.skipIf(!hasR)(
    'R base: read.csv + lm + summary (Rscript)',
    () => {
      const run = spawnSync('Rscript', ['-e', `d <- read.csv("${path}"); s <- summary(lm(${formula}, data = d)); invisible(s$coefficients)`], { encoding: 'utf8' });
      if (run.status !== 0) throw new Error(run.stderr);
    },
    options,
  );
});
