import { createWriteStream, existsSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** Column names of the generated benchmark file: outcome, treatment, ten covariates. */
export const BENCH_COLUMNS = ['outcome', 'treatment', 'x1', 'x2', 'x3', 'x4', 'x5', 'x6', 'x7', 'x8', 'x9', 'x10'];

/** A deterministic pseudo-random generator (mulberry32), so every run reads the same file. */
function generator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Writes (once) a CSV of `rows` rows × 12 numeric columns of invented data to the temp folder and returns
 * its path: covariates uniform, treatment depending on three covariates, outcome on treatment and covariates.
 */
export async function benchCsv(rows: number): Promise<string> {
  const path = join(tmpdir(), `lurk-bench-regression-${rows}.csv`);
  if (existsSync(path) && statSync(path).size > rows * 20) return path;
  const random = generator(20261202);
  const out = createWriteStream(path);
  const write = (text: string) => new Promise<void>((resolve) => (out.write(text) ? resolve() : out.once('drain', () => resolve())));
  await write(BENCH_COLUMNS.join(',') + '\n');
  let block = '';
  for (let i = 0; i < rows; i++) {
    const x = Array.from({ length: 10 }, () => random() * 100 - 50);
    const d = 0.3 * x[0] - 0.2 * x[1] + 0.1 * x[2] + (random() - 0.5) * 40;
    const y = 2 + 0.5 * d + x.reduce((s, v, k) => s + v * (k % 3 === 0 ? 0.2 : -0.1), 0) + (random() - 0.5) * 60;
    block += [y.toFixed(4), d.toFixed(4), ...x.map((v) => v.toFixed(3))].join(',') + '\n';
    if (block.length > 1 << 20) {
      await write(block);
      block = '';
    }
  }
  await write(block);
  await new Promise<void>((resolve) => out.end(resolve));
  return path;
}
