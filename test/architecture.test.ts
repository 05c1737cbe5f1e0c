/**
 * Architecture invariants that a test can check (see ARCHITECTURE.md):
 * - shared-core imports nothing from editor or protocol packages;
 * - the engine's layers depend one way: units ← physics ← evaluate; the parser knows no physics;
 * - no dynamic code evaluation anywhere in shipped sources;
 * - shipped code never imports the test oracle (psychrolib).
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
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
        if (/\beval\s*\(|\bnew\s+Function\s*\(/.test(text)) bad.push(`${relative(root, f)} evaluates code`);
        if (importsOf(f).some((s) => s === 'psychrolib')) bad.push(`${relative(root, f)} imports the test oracle psychrolib`);
      }
    }
    expect(bad).toEqual([]);
  });
});
