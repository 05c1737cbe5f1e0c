/**
 * `dewmark diff [REV] [-- FILES]` on a scratch git repository made in a temporary folder: a note
 * is committed, an input upstream is edited, and every figure downstream of it (with the claims
 * written about it) must be listed, unchanged notes must print nothing, notes added and deleted
 * since the revision are named as such, the JSON has the fields docs/diff.md documents, and a bad
 * revision or a folder outside git is a clear exit 2. The notes are of an invented building.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { run, type CliIO } from '../src/run';

let repo = '';
let outside = '';

const note = (oaDb: string, prose = 'Summer design day, AHU-2 of the Harrow Lane depot (an invented building).') =>
  [
    '# Harrow Lane depot — AHU-2 summer check',
    '',
    prose,
    '',
    '```air',
    `state OA: db=${oaDb} wb=21C`,
    'state RA: db=24C rh=50%',
    'mix MA: OA 30% + RA 70% db=26.4C',
    'state OFF: db=12C rh=92%',
    'process CC: MA -> OFF m=3.2kg/s q_total=-60kW',
    'state ROOM2: db=22C rh=45%',
    '```',
    '',
  ].join('\n');

const OTHER = ['# Harrow Lane depot — store room', '', '```air', 'state STORE: db=20C rh=40%', '```', ''].join('\n');

/** The fields of eval's JSON and the keys diff names them by. */
const EVAL_FIELD_KEY: Record<string, string> = {
  p_kPa: 'p',
  db_C: 'db',
  wb_C: 'wb',
  dp_C: 'dp',
  rh_pct: 'rh',
  w_kgkg: 'w',
  h_kJkg: 'h',
  v_m3kg: 'v',
  m_kgs: 'm',
  q_total_kW: 'q_total',
  q_sensible_kW: 'q_sensible',
  q_latent_kW: 'q_latent',
  q_coil_kW: 'q_coil',
  shr: 'shr',
  water_kgh: 'water',
};

function git(args: string[], cwd = repo): string {
  return execFileSync(
    'git',
    ['-c', 'user.name=Dewmark Test', '-c', 'user.email=test@example.invalid', '-c', 'commit.gpgsign=false', ...args],
    { cwd, encoding: 'utf8' },
  );
}

interface Run {
  code: number;
  out: string;
  err: string;
}

async function dewmark(args: string[], cwd = repo): Promise<Run> {
  let out = '';
  let err = '';
  const io: CliIO = {
    cwd,
    out: (t) => (out += t),
    err: (t) => (err += t),
    stdin: async () => new Uint8Array(),
    stderrIsTTY: false,
  };
  const code = await run(args, io);
  return { code, out, err };
}

/** Writes the working tree back to the committed state. */
function reset(): void {
  git(['checkout', '--', '.']);
  git(['clean', '-fdq']);
}

beforeAll(() => {
  repo = mkdtempSync(join(tmpdir(), 'dewmark-diff-'));
  outside = mkdtempSync(join(tmpdir(), 'dewmark-nogit-'));
  git(['init', '-q']);
  mkdirSync(join(repo, 'notes'));
  writeFileSync(join(repo, 'notes', 'ahu2.md'), note('32C'));
  writeFileSync(join(repo, 'notes', 'store.md'), OTHER);
  writeFileSync(join(repo, 'notes', 'old.md'), OTHER.replace('store room', 'old plant room'));
  git(['add', '.']);
  git(['commit', '-q', '-m', 'notes']);
  writeFileSync(join(outside, 'a.md'), OTHER);
});

afterAll(() => {
  for (const d of [repo, outside]) if (d) rmSync(d, { recursive: true, force: true });
});

describe('dewmark diff: an input edited upstream', () => {
  it('lists every downstream figure that changed, with the claims written on it, and nothing unchanged', async () => {
    reset();
    writeFileSync(join(repo, 'notes', 'ahu2.md'), note('35C'));
    const r = await dewmark(['diff', '--format', 'json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out);
    expect(doc.files).toHaveLength(1);
    const f = doc.files[0];
    expect(f).toMatchObject({ path: 'notes/ahu2.md', status: 'changed' });
    // OA was edited; MA mixes it; CC leaves from MA. RA, OFF and ROOM2 do not depend on it.
    expect(f.items.map((i: { name: string }) => i.name)).toEqual(['OA', 'MA', 'CC']);
    const byName = Object.fromEntries(f.items.map((i: { name: string }) => [i.name, i]));
    const keys = (name: string) => byName[name].figures.map((x: { key: string }) => x.key);
    // A state fixed by db and wb: its wet bulb stays as written, the rest moves with db.
    expect(keys('OA')).toEqual(['db', 'dp', 'rh', 'w', 'h', 'v']);
    // Its mix moves in dry bulb and moisture; its wet bulb hardly (a constant wet bulb is close to
    // a constant enthalpy: common practice).
    expect(keys('MA')).toEqual(expect.arrayContaining(['db', 'dp', 'w']));
    expect(keys('CC')).toEqual(expect.arrayContaining(['q_total', 'q_sensible']));
    for (const it of f.items) for (const fig of it.figures) expect(fig.old).not.toBe(fig.new);
    // Adiabatic mixing: the mixed dry bulb is close to the mass-weighted mean of the streams'
    // (common practice): 0.3·32 + 0.7·24 = 26.4 °C before, 0.3·35 + 0.7·24 = 27.3 °C after.
    const maDb = byName.MA.figures.find((x: { key: string }) => x.key === 'db');
    expect(parseFloat(maDb.old)).toBeCloseTo(26.4, 0);
    expect(parseFloat(maDb.new)).toBeCloseTo(27.3, 0);
    expect(maDb.old).toMatch(/°C$/);
    // The claims about the changed figures come with them, old and new verdicts.
    expect(maDb.claims).toEqual([
      {
        key: 'db',
        written: 'db=26.4C',
        line: 8,
        old: { computed: expect.any(String), pass: expect.any(Boolean) },
        new: { computed: expect.any(String), pass: expect.any(Boolean) },
      },
    ]);
    expect(maDb.claims[0].old.computed).not.toBe(maDb.claims[0].new.computed);
    const ccTotal = byName.CC.figures.find((x: { key: string }) => x.key === 'q_total');
    expect(ccTotal.claims.map((c: { written: string }) => c.written)).toEqual(['q_total=-60kW']);
    expect(byName.OA.line).toBe(6);
    expect(doc.summary).toEqual({
      compared: 3,
      changed: 1,
      added: 0,
      deleted: 0,
      figures: f.items.reduce((n: number, i: { figures: unknown[] }) => n + i.figures.length, 0),
      problems: 0,
    });
    expect(doc.revision).toBe('HEAD');
    expect(doc.commit).toBe(git(['rev-parse', 'HEAD']).trim());
  });

  it('agrees with eval: each figure eval gives differently (beyond display rounding) is listed, no other', async () => {
    reset();
    const before = JSON.parse((await dewmark(['eval', '--format', 'json', 'notes/ahu2.md'])).out).files[0];
    writeFileSync(join(repo, 'notes', 'ahu2.md'), note('35C'));
    const after = JSON.parse((await dewmark(['eval', '--format', 'json', 'notes/ahu2.md'])).out).files[0];
    const listed = JSON.parse((await dewmark(['diff', '--format', 'json'])).out).files[0].items;
    const listedKeys = new Map<string, string[]>(
      listed.map((i: { name: string; figures: { key: string }[] }) => [i.name, i.figures.map((f) => f.key)]),
    );
    let checked = 0;
    for (const group of ['states', 'processes'] as const) {
      for (const o of before[group]) {
        const n = after[group].find((x: { name: string }) => x.name === o.name);
        for (const [field, key] of Object.entries(EVAL_FIELD_KEY)) {
          if (typeof o[field] !== 'number' || typeof n[field] !== 'number') continue;
          const moved = Math.abs(n[field] - o[field]) > 0.02 * Math.max(Math.abs(o[field]), 1e-9);
          const unmoved = n[field] === o[field];
          if (moved) expect(listedKeys.get(o.name), `${o.name}.${key}`).toContain(key);
          if (unmoved) expect(listedKeys.get(o.name) ?? [], `${o.name}.${key}`).not.toContain(key);
          if (moved || unmoved) checked++;
        }
      }
    }
    expect(checked).toBeGreaterThanOrEqual(30);
  });

  it('prints the same in text: state, property, old → new and the claims; unchanged notes not at all', async () => {
    reset();
    writeFileSync(join(repo, 'notes', 'ahu2.md'), note('35C'));
    const json = JSON.parse((await dewmark(['diff', '--format', 'json'])).out);
    const r = await dewmark(['diff']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('notes/ahu2.md: changed since HEAD\n');
    expect(r.out).not.toContain('store.md');
    expect(r.out).not.toMatch(/\b(RA|OFF|ROOM2)\b/);
    for (const it of json.files[0].items) {
      expect(r.out).toContain(`  ${it.kind} ${it.name} (line ${it.line})\n`);
      for (const fig of it.figures) expect(r.out).toContain(`    ${fig.key}: ${fig.old} → ${fig.new}\n`);
    }
    expect(r.out).toMatch(
      /\n {6}claim db=26\.4C \(line 8\): (pass|FAIL) \(computed [^)]+\) → (pass|FAIL) \(computed [^)]+\)\n/,
    );
    expect(r.out).toMatch(/\n {6}claim q_total=-60kW \(line 10\): /);
    expect(r.out.trimEnd().split('\n').at(-1)).toMatch(
      /^1 note changed, 0 added, 0 deleted, \d+ figures changed \(3 compared with HEAD [0-9a-f]{12}\)$/,
    );
  });

  it('--exit-code gives 1 when a figure changed and 0 when none did', async () => {
    reset();
    expect((await dewmark(['diff', '--exit-code'])).code).toBe(0);
    writeFileSync(join(repo, 'notes', 'ahu2.md'), note('35C'));
    expect((await dewmark(['diff', '--exit-code'])).code).toBe(1);
  });
});

describe('dewmark diff: what is not a change', () => {
  it('prints no note when nothing was edited', async () => {
    reset();
    const r = await dewmark(['diff']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(
      /^0 notes changed, 0 added, 0 deleted, 0 figures changed \(3 compared with HEAD [0-9a-f]{12}\)\n$/,
    );
  });

  it('prints no note when only prose changed (same figures)', async () => {
    reset();
    writeFileSync(join(repo, 'notes', 'ahu2.md'), note('32C', 'Summer design day, checked again after the survey.'));
    const r = await dewmark(['diff', '--format', 'json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).files).toEqual([]);
  });

  it('prints no note when a figure moved below its last shown digit', async () => {
    reset();
    writeFileSync(join(repo, 'notes', 'ahu2.md'), note('32.001C'));
    const r = await dewmark(['diff', '--format', 'json']);
    expect(JSON.parse(r.out).files).toEqual([]);
  });
});

describe('dewmark diff: notes and statements added or removed', () => {
  it('names notes added and deleted since the revision, and statements added and removed', async () => {
    reset();
    unlinkSync(join(repo, 'notes', 'old.md'));
    writeFileSync(join(repo, 'notes', 'new.md'), OTHER);
    writeFileSync(
      join(repo, 'notes', 'ahu2.md'),
      note('32C').replace('state ROOM2: db=22C rh=45%', 'state ROOM3: db=22C rh=45%'),
    );
    const r = await dewmark(['diff']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('notes/new.md: added since HEAD\n');
    expect(r.out).toContain('notes/old.md: deleted since HEAD\n');
    expect(r.out).toContain('  state ROOM3 (line 11): added\n');
    expect(r.out).toContain('  state ROOM2 (line 11): removed\n');
    const doc = JSON.parse((await dewmark(['diff', '--format', 'json'])).out);
    expect(doc.summary).toMatchObject({ changed: 1, added: 1, deleted: 1, figures: 0 });
    expect(doc.files.find((f: { path: string }) => f.path === 'notes/old.md')).toEqual({
      path: 'notes/old.md',
      status: 'deleted',
      items: [],
    });
  });

  it('compares only the files after --, also a deleted one, from a subfolder', async () => {
    reset();
    unlinkSync(join(repo, 'notes', 'old.md'));
    writeFileSync(join(repo, 'notes', 'ahu2.md'), note('35C'));
    const r = await dewmark(['diff', 'HEAD', '--', 'old.md', 'store.md'], join(repo, 'notes'));
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toContain('old.md: deleted since HEAD\n');
    expect(r.out).not.toContain('ahu2');
    expect(r.out).toContain('(1 compared with HEAD');
  });

  it('compares with an older revision', async () => {
    reset();
    writeFileSync(join(repo, 'notes', 'ahu2.md'), note('35C'));
    git(['commit', '-q', '-am', 'hotter day']);
    try {
      expect((await dewmark(['diff', '--format', 'json'])).out).toContain('"files": []');
      const doc = JSON.parse((await dewmark(['diff', 'HEAD~1', '--format', 'json'])).out);
      expect(doc.revision).toBe('HEAD~1');
      expect(doc.files.map((f: { path: string }) => f.path)).toEqual(['notes/ahu2.md']);
    } finally {
      git(['reset', '-q', '--hard', 'HEAD~1']);
    }
  });
});

describe('dewmark diff: bad input', () => {
  it('an unknown revision is exit 2 with what to give instead', async () => {
    const r = await dewmark(['diff', 'no-such-branch']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/^dewmark: unknown revision 'no-such-branch': .*HEAD~1/);
  });

  it('a revision that looks like an option is refused, not handed to git', async () => {
    const r = await dewmark(['diff', '--', '--output=x']);
    // After -- it is a file name: a missing file is simply not found.
    expect(r.code).toBe(2);
    const r2 = await dewmark(['diff', '-x']);
    expect(r2.code).toBe(2);
    expect(r2.err).toMatch(/unknown option '-x'/);
  });

  it('two operands without -- are a usage error that shows the right form', async () => {
    const r = await dewmark(['diff', 'HEAD', 'notes/ahu2.md']);
    expect(r.code).toBe(2);
    expect(r.err).toBe(
      'dewmark: dewmark diff takes one revision, then files after --: e.g. dewmark diff HEAD -- notes/ahu2.md\n',
    );
  });

  it('outside a git repository is exit 2 saying so', async () => {
    const r = await dewmark(['diff'], outside);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/is not inside a git repository/);
  });

  it('a bad --format is exit 2', async () => {
    const r = await dewmark(['diff', '--format', 'sarif']);
    expect(r.code).toBe(2);
    expect(r.err).toBe("dewmark: --format must be text or json for diff, not 'sarif'\n");
  });

  it('the help names the exit codes and shows examples', async () => {
    const r = await dewmark(['diff', '--help']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('[REV] [-- FILES...]');
    expect(r.out).toMatch(/Exit codes:\n {2}0 .*\n {2}1 .*\n {2}2 /);
    expect(r.out).toContain('dewmark diff main -- notes/ahu-1.md');
  });
});
