// `npm run demo`: evaluates and checks the example notes with the built `dewmark` command and
// prints what it says. The second example has two deliberate problems, so its check reports an
// error and a warning; the demo itself still exits 0.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const bin = join(root, 'bin', 'dewmark.js');
if (!existsSync(join(root, 'dist', 'cli.js'))) {
  console.error('demo: dist/cli.js is missing; run npm run build first (npm run demo does it)');
  process.exit(1);
}

const rule = (title) => console.log(`\n${'='.repeat(78)}\n${title}\n${'='.repeat(78)}\n`);

function dewmark(args) {
  console.log(`$ dewmark ${args.join(' ')}\n`);
  const r = spawnSync(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8' });
  process.stdout.write(r.stdout);
  if (r.stderr) process.stdout.write(r.stderr);
  console.log(`(exit code ${r.status})`);
  return r.status;
}

rule('1. AHU-1 at 1600 m: the calculation as one chain, from the loads to every coil');
dewmark(['eval', 'examples/kestrel-ridge-ahu1.md']);

rule('2. The meeting-room note: its evaluated states');
dewmark(['eval', 'examples/level2-meeting-room-check.md']);

rule('3. Checking both notes, as CI would');
console.log('The meeting-room note has a DELIBERATE stale claim (rh=45%) and a DELIBERATE');
console.log('infeasible state (wet-bulb above dry-bulb), so this check reports them and exits 1.\n');
const code = dewmark(['check', 'examples']);
console.log(
  code === 1
    ? '\nAs intended: the check found the deliberate problems (exit 1).'
    : `\nUnexpected exit code ${code}: the examples should give exactly the deliberate problems.`,
);

rule('4. The same check as JSON (first lines)');
const r = spawnSync(process.execPath, [bin, 'check', '--format', 'json', 'examples'], { cwd: root, encoding: 'utf8' });
console.log(r.stdout.split('\n').slice(0, 24).join('\n'));
console.log('…');

// The demo succeeds when the deliberate problems were found; anything else is a real failure.
process.exitCode = code === 1 ? 0 : 1;
