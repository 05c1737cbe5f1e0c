// `npm run fuzz`: the long fuzzing run. 10⁵ random notes and 10⁴ random edit sequences through the
// in-memory language service, the edit properties on 2·10⁴ notes, and 3000 random edits through a
// spawned language server — the same tests that `npm test` runs with a few thousand notes.
//
// A fresh random seed each run (printed first), or DEWMARK_FUZZ_SEED to repeat one; the counts
// can be set with DEWMARK_FUZZ_RUNS (notes), DEWMARK_FUZZ_EDITS (edit sequences) and
// DEWMARK_FUZZ_PROTOCOL_EDITS. A failure prints the seed and fast-check's path to the input.
import { spawnSync } from 'node:child_process';
import { randomInt } from 'node:crypto';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const env = { ...process.env };
env.DEWMARK_FUZZ_SEED ??= String(randomInt(1, 2 ** 31 - 1));
env.DEWMARK_FUZZ_RUNS ??= '100000';
env.DEWMARK_FUZZ_EDITS ??= '10000';
env.DEWMARK_FUZZ_PROTOCOL_EDITS ??= '3000';

console.log(
  `fuzz: seed ${env.DEWMARK_FUZZ_SEED}, ${env.DEWMARK_FUZZ_RUNS} notes, ${env.DEWMARK_FUZZ_EDITS} ` +
    `edit sequences, ${env.DEWMARK_FUZZ_PROTOCOL_EDITS} protocol edits` +
    `\nfuzz: repeat this run with DEWMARK_FUZZ_SEED=${env.DEWMARK_FUZZ_SEED} npm run fuzz`,
);

const build = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, stdio: 'inherit' });
if (build.status !== 0) process.exit(build.status ?? 1);

const files = [
  'shared-core/test/robustness-fuzz.test.ts',
  'shared-core/test/robustness-edits.test.ts',
  'test/protocol/robustness.test.ts',
];
const run = spawnSync(process.execPath, [join(root, 'node_modules', 'vitest', 'vitest.mjs'), 'run', ...files], {
  cwd: root,
  env,
  stdio: 'inherit',
});
if (run.status !== 0)
  console.error(`fuzz: failed; repeat with DEWMARK_FUZZ_SEED=${env.DEWMARK_FUZZ_SEED} npm run fuzz`);
process.exit(run.status ?? 1);
