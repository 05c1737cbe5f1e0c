/**
 * The Node server makes V8 wait longer before optimising a function (`server/src/tierUp.ts`), so
 * that code run only while the server starts is not optimised, and it does so before any other of
 * its modules initialises. Checked by counting, not by time: V8's own trace says which functions
 * it optimises during a run-once workload, with and without the server's setting.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { TIER_UP_FLAGS } from '../src/tierUp';

const tierUpModule = pathToFileURL(join(__dirname, '..', 'src', 'tierUp.ts')).href;

/**
 * How often V8's optimisation trace names `buildTable` when it runs 80 times, as a module's
 * start-up code builds its tables (8,000 loop turns in all: past V8's default budget, within
 * 16 times it).
 */
function tierUpTrace(withSetting: boolean): number {
  const script = `
${withSetting ? `import ${JSON.stringify(tierUpModule)};` : ''}
function buildTable(n) {
  const out = [];
  for (let i = 0; i < n; i++) out.push({ key: 'k' + i, value: i * 3 });
  return out;
}
let rows = 0;
for (let k = 0; k < 80; k++) rows += buildTable(100).length;
process.stderr.write(String(rows));
`;
  const r = spawnSync(process.execPath, ['--trace-opt', '--import', 'tsx', '--input-type=module', '-e', script], {
    cwd: join(__dirname, '..', '..'),
    encoding: 'utf8',
    timeout: 60_000,
  });
  if (r.status !== 0) throw new Error(`child failed: ${r.stderr}`);
  expect(r.stderr).toBe('8000');
  // The trace of every tier-up step names the function (marking, compiling, completed). Counted in
  // the whole text: the compiler's worker thread writes to the same stream, so lines can interleave.
  return r.stdout.match(/<JSFunction buildTable /g)?.length ?? 0;
}

describe('the server raises the budget before V8 optimises a function', () => {
  it('leaves run-once start-up code unoptimised, where V8 alone marks it for optimisation', () => {
    expect(tierUpTrace(false)).toBeGreaterThan(0);
    expect(tierUpTrace(true)).toBe(0);
  });

  it('applies it before any other module of the Node server initialises (its first import)', () => {
    const main = readFileSync(join(__dirname, '..', 'src', 'main.ts'), 'utf8');
    const firstImport = /^import\b.*$/m.exec(main)?.[0];
    expect(firstImport).toBe("import './tierUp';");
  });

  it('sets only settings V8 takes at run time, in the form node takes them', () => {
    for (const flag of TIER_UP_FLAGS) {
      const r = spawnSync(process.execPath, [flag, '-e', ''], { encoding: 'utf8' });
      expect(r.status, `${flag}: ${r.stderr}`).toBe(0);
      expect(r.stderr).toBe('');
    }
  });
});
