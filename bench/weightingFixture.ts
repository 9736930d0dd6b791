import { SplitMix64 } from '../src/core/seededRandom';

/**
 * Invented data for the weighting benchmarks (fictional): n people, a 0/1 treatment that depends on five
 * covariates (three normal, two binary), and an outcome with a treatment effect of 0.3; seeded, so every
 * benchmark reads the same file.
 */
export function fictionalCsv(n: number, seed: number): string {
  const g = new SplitMix64(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - g.nextDouble())) * Math.cos(2 * Math.PI * g.nextDouble());
  const lines = ['treated,outcome,x1,x2,x3,x4,x5'];
  for (let i = 0; i < n; i++) {
    const x = [normal(), normal(), normal(), g.nextDouble() < 0.3 ? 1 : 0, g.nextDouble() < 0.6 ? 1 : 0];
    const eta = 0.4 * x[0] - 0.3 * x[1] + 0.2 * x[2] + 0.5 * x[3] - 0.4 * x[4];
    const t = g.nextDouble() < 1 / (1 + Math.exp(-eta)) ? 1 : 0;
    const y = 0.3 * t + x[0] + 0.5 * x[1] + 0.3 * x[3] + normal();
    lines.push([t, y.toFixed(4), x[0].toFixed(4), x[1].toFixed(4), x[2].toFixed(4), x[3], x[4]].join(','));
  }
  return lines.join('\n') + '\n';
}
