// Peak memory of the streaming regression at 100,000 and at 1,000,000 rows (invented data, 12 numeric
// columns): sampled after every 64 KiB chunk, as heap + array buffers above the level before the run.
// The two peaks should be about equal (memory independent of the row count). Printed after each run.
// Run: npx vitest bench --run --project unit bench/regressionMemory.bench.ts
import { createReadStream } from 'node:fs';
import { bench, describe } from 'vitest';
import { accumulateRegressionFromStream } from '../src/methods/regression/regressionData';
import { benchCsv } from './regressionFixture';

const sizes = [100_000, 1_000_000];
const paths = new Map<number, string>();
for (const rows of sizes) paths.set(rows, await benchCsv(rows));

function used(): number {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
}

describe('peak memory of the streaming regression', () => {
  for (const rows of sizes) {
    bench(
      `${rows.toLocaleString('en')} rows`,
      async () => {
        const before = used();
        let peak = 0;
        const data = await accumulateRegressionFromStream(createReadStream(paths.get(rows)!), { outcome: 'outcome', treatment: 'treatment' }, {
          onProgress: () => void (peak = Math.max(peak, used() - before)),
        });
        const rss = process.resourceUsage().maxRSS;
        console.log(`${rows} rows (${data.rowsUsed} used): peak heap + buffers above start ${(peak / 2 ** 20).toFixed(1)} MiB; process max RSS so far ${(rss / 1024).toFixed(0)} MiB`);
      },
      { iterations: 2, warmupIterations: 0, time: 0 },
    );
  }
});
