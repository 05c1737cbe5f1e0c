/**
 * Architecture invariants that a test can check (see ARCHITECTURE.md):
 * - shared-core imports nothing from editor or protocol packages;
 * - the engine's layers depend one way: units ← physics ← evaluate; the parser knows no physics;
 * - no dynamic code evaluation anywhere in shipped sources, nor in the bundles built from them
 *   (dist/, third-party code included: the bundles are what runs);
 * - shipped code never imports the test oracle (psychrolib).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

const root = join(__dirname, '..');

function sourcesUnder(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    let entries: string[];
    try {
      entries = readdirSync(d);
    } catch {
      return;
    }
    for (const e of entries) {
      if (e === 'node_modules' || e === 'dist') continue;
      const p = join(d, e);
      if (statSync(p).isDirectory()) walk(p);
      else if (/\.(ts|mts|js|mjs|cjs)$/.test(e)) out.push(p);
    }
  };
  walk(join(root, dir));
  return out;
}

function importsOf(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  const specs: string[] = [];
  const re = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\s*\(\s*['"]([^'"]+)['"]\s*\)|require\s*\(\s*['"]([^'"]+)['"]\s*\)/g;
  for (let m = re.exec(text); m; m = re.exec(text)) specs.push((m[1] ?? m[2] ?? m[3])!);
  return specs;
}

const shipped = ['shared-core/src', 'server/src', 'client/src', 'cli/src'];

/** Ways to run text as code: eval, the Function constructor, the vm module, setTimeout/setInterval with a string. */
const DYNAMIC_CODE: [string, RegExp][] = [
  ['eval(', /(?<![.\w$])eval\s*\(/],
  ['new Function(', /\bnew\s+Function\s*\(/],
  ['Function(', /(?<![.\w$])Function\s*\(\s*['"`]/],
  ['the vm module', /require\(\s*['"](node:)?vm['"]\s*\)|from\s+['"](node:)?vm['"]/],
  ['setTimeout/setInterval with a string', /\bset(Timeout|Interval)\(\s*['"`]/],
];

/** The bundles that ship (the .vsix and the CLI), built first when they are missing. */
function bundles(): string[] {
  const names = ['dist/cli.js', 'dist/server.js', 'dist/client.js'];
  if (!names.every((n) => existsSync(join(root, n)))) {
    const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
    if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  }
  return names.map((n) => join(root, n));
}

describe('architecture invariants', () => {
  it('shared-core has sources to check (the scan itself can fail)', () => {
    expect(sourcesUnder('shared-core/src').length).toBeGreaterThan(5);
  });

  it('shared-core imports no editor or protocol package', () => {
    const bad: string[] = [];
    for (const f of sourcesUnder('shared-core/src')) {
      for (const s of importsOf(f)) {
        if (/^(vscode|vscode-[a-z-]+|@vscode\/)/.test(s)) bad.push(`${relative(root, f)} imports ${s}`);
        if (/^node:|^(fs|path|child_process|net|http|https|os)$/.test(s)) bad.push(`${relative(root, f)} imports ${s} (the core is pure: text in, data out)`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('the other packages reach the core only through its package name', () => {
    const bad: string[] = [];
    for (const dir of ['server/src', 'client/src', 'cli/src']) {
      for (const f of sourcesUnder(dir)) {
        for (const s of importsOf(f)) if (/shared-core\//.test(s)) bad.push(`${relative(root, f)} imports ${s}; use @dewmark/core/…`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('units and physics do not depend on the notation, evaluator or service', () => {
    const bad: string[] = [];
    for (const layer of ['units', 'physics']) {
      for (const f of sourcesUnder(`shared-core/src/${layer}`)) {
        for (const s of importsOf(f)) {
          if (/\.\.\/(notation|evaluate|service|markdown|chart)/.test(s)) bad.push(`${relative(root, f)} imports ${s}`);
          if (layer === 'units' && /\.\.\/physics/.test(s)) bad.push(`${relative(root, f)} imports ${s}`);
        }
      }
    }
    expect(bad).toEqual([]);
  });

  it('the parser and Markdown reader know no physics', () => {
    const bad: string[] = [];
    for (const layer of ['notation', 'markdown', 'text']) {
      for (const f of sourcesUnder(`shared-core/src/${layer}`)) {
        for (const s of importsOf(f)) {
          if (/\.\.\/(physics|evaluate|service)/.test(s)) bad.push(`${relative(root, f)} imports ${s}`);
        }
      }
    }
    expect(bad).toEqual([]);
  });

  it('no eval or new Function in shipped sources, and no test oracle', () => {
    const bad: string[] = [];
    for (const dir of shipped) {
      for (const f of sourcesUnder(dir)) {
        const text = readFileSync(f, 'utf8');
        for (const [what, re] of DYNAMIC_CODE) if (re.test(text)) bad.push(`${relative(root, f)} uses ${what}`);
        if (importsOf(f).some((s) => s === 'psychrolib')) bad.push(`${relative(root, f)} imports the test oracle psychrolib`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('the dynamic-code patterns find what they look for (the scans can fail)', () => {
    const samples = ['x = eval("1")', 'f = new Function("a", "return a")', 'g = Function("return this")', "const vm = require('node:vm')", "setTimeout('alert(1)', 5)"];
    expect(samples.map((t) => DYNAMIC_CODE.some(([, re]) => re.test(t)))).toEqual([true, true, true, true, true]);
    const innocent = ['obj.eval(x)', 'isFunction(y)', 'typeof f === "function"', 'setTimeout(() => done(), 5)', 'medieval(3)'];
    expect(innocent.map((t) => DYNAMIC_CODE.some(([, re]) => re.test(t)))).toEqual([false, false, false, false, false]);
  });

  it('no dynamic code evaluation in the built bundles either, third-party code included', () => {
    const bad: string[] = [];
    for (const f of bundles()) {
      const text = readFileSync(f, 'utf8');
      expect(text.length, `${relative(root, f)} is a real bundle`).toBeGreaterThan(10_000);
      for (const [what, re] of DYNAMIC_CODE) {
        const m = re.exec(text);
        if (m) bad.push(`${relative(root, f)} uses ${what} near: ${text.slice(Math.max(0, m.index - 60), m.index + 60)}`);
      }
      if (/psychrolib|GetTWetBulbFromHumRatio/.test(text)) bad.push(`${relative(root, f)} contains the test oracle`);
    }
    expect(bad).toEqual([]);
  });
});
