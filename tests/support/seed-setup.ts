import fc from 'fast-check';

// With AMBIT_SEED set, every property (and every live reference case, see live-cases.ts) draws from that seed,
// so a run can be replayed exactly. CI sets it from the commit being tested: the run before a commit lands and
// the run after it see the same inputs, while each new commit still explores new ones.
const seed = process.env.AMBIT_SEED;
if (seed !== undefined && seed !== '') {
  const value = Number(seed);
  if (!Number.isSafeInteger(value)) throw new Error(`AMBIT_SEED must be an integer, got '${seed}'`);
  fc.configureGlobal({ seed: value | 0 });
}
