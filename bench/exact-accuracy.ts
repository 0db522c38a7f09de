// The exact solver against the double-double characteristic-matrix cascade (test/support/dd-cascade.ts):
//   npx tsx bench/exact-accuracy.ts [stacks] [seed]
// prints the worst error relative to max(|R|, |T|) on the low-loss slabs of the accuracy checks and on random
// low-loss stacks, and the worst ratio to the bound the tests hold it to (max(1e-12, 6 × the phase limit)).

import { compareWithReference, randomLowLossStack } from '../test/support/dd-cascade.ts';
import { dielectric, layer, makeStack, prng } from '../test/support/build-stack.ts';

const lowLoss = dielectric(4, 2e-7, 'low-loss');
for (const [d_m, f_GHz] of [[1, 99], [1, 99.5], [1, 100], [10, 999], [10, 1000]] as const) {
  const c = compareWithReference(makeStack({ layers: [layer(lowLoss, d_m)] }), f_GHz * 1e9);
  console.log(`${d_m} m of ε_r 4, σ 2e-7 S/m at ${f_GHz} GHz: |k d| = ${c.phase.toExponential(2)} rad, error ${c.err.toExponential(2)} (bound ${c.bound.toExponential(2)})`);
}
const n = Number(process.argv[2] ?? 5000), seed = Number(process.argv[3] ?? 1);
const rand = prng(seed);
let worst = 0, worstRatio = 0, worstSmallPhase = 0, tested = 0;
while (tested < n) {
  const { stack, f_Hz } = randomLowLossStack(rand);
  const c = compareWithReference(stack, f_Hz);
  if (c.loss > 30) continue;
  tested++;
  worst = Math.max(worst, c.err);
  worstRatio = Math.max(worstRatio, c.err / c.bound);
  if (c.bound === 1e-12) worstSmallPhase = Math.max(worstSmallPhase, c.err);
}
console.log(`${tested} random low-loss stacks (seed ${seed}): worst error ${worst.toExponential(2)}; ` +
  `where the phase limit is below 1e-12: worst ${worstSmallPhase.toExponential(2)}; worst ratio to the bound ${worstRatio.toFixed(3)}`);
