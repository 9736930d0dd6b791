// One seed for every property test of a run (fast-check's global settings): CI is reproducible, and a failure
// prints the seed and path to replay it. Explore other inputs with LURK_PROPERTY_SEED=<integer> (or "random").
import fc from 'fast-check';

const chosen = process.env.LURK_PROPERTY_SEED;
const seed = chosen === 'random' ? Date.now() % 2147483647 : chosen !== undefined && /^-?\d+$/.test(chosen) ? Number(chosen) : 20261202;
fc.configureGlobal({ seed });
