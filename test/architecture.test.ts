/**
 * Architecture invariants that a test can check (see ARCHITECTURE.md):
 * - one allowed-dependency map, read from ARCHITECTURE.md's two tables (core layers and
 *   packages): every import of every shipped source file must be listed in its row, every listed
 *   dependency must be used, the map has no cycle, and a package reaches another package only by
 *   its name (`@dewmark/core/<layer>`, `@dewmark/protocol`), never by a relative path;
 * - no dynamic code evaluation anywhere in shipped sources, nor in the bundles built from them
 *   (dist/, third-party code included: the bundles are what runs);
 * - shipped code never imports the test oracle (psychrolib).
 * Each rule is also run on made-up imports that break it, to show that it can fail.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { dirname, join, relative } from 'node:path';
import ts from 'typescript';

const root = join(__dirname, '..');

/** Core layers are the folders of shared-core/src; a layer's token is its name with a slash (`text/`). */
const CORE_SRC = 'shared-core/src';
/** The packages whose sources ship (folder → what the table calls the folder). */
const PACKAGE_DIRS = ['protocol', 'files', 'cli', 'server', 'client'] as const;
/** Stands for every Node built-in module in the tables. */
const NODE = 'node:';

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

/**
 * Every module specifier a file imports, re-exports, `import()`s or `require()`s (TypeScript's own
 * scanner: comments and strings are not imports).
 */
function importsOf(text: string): string[] {
  return ts.preProcessFile(text, true, true).importedFiles.map((f) => f.fileName);
}

/** The allowed-dependency map: node (`text/`, `server/`) → the tokens it may import. */
type DependencyMap = Map<string, Set<string>>;

/** Reads the map from the tables of ARCHITECTURE.md whose header ends in `imports`. */
function readMap(markdown: string): DependencyMap {
  const map: DependencyMap = new Map();
  let inTable = false;
  for (const line of markdown.split('\n')) {
    if (/^\|.*\|\s*imports\s*\|\s*$/.test(line)) {
      inTable = true;
      continue;
    }
    if (!line.startsWith('|')) {
      inTable = false;
      continue;
    }
    if (!inTable || /^\|[-\s|]+\|$/.test(line)) continue;
    const cells = line.split('|').slice(1, -1);
    const node = /`([^`]+)`/.exec(cells[0] ?? '')?.[1];
    const deps = cells.at(-1) ?? '';
    if (!node) throw new Error(`ARCHITECTURE.md: a table row without a module name: ${line}`);
    map.set(node, new Set([...deps.matchAll(/`([^`]+)`/g)].map((m) => m[1]!)));
  }
  return map;
}

/** The npm name of each workspace package folder (`protocol/` → `@dewmark/protocol`). */
function packageNames(): Map<string, string> {
  const names = new Map<string, string>();
  for (const dir of [...PACKAGE_DIRS, 'shared-core']) {
    names.set(`${dir}/`, JSON.parse(readFileSync(join(root, dir, 'package.json'), 'utf8')).name as string);
  }
  return names;
}

/** The node a source file belongs to (`shared-core/src/evaluate/mix.ts` → `evaluate/`), or null. */
function nodeOf(path: string): string | null {
  const parts = path.split('/');
  // `shared-core/src/evaluate/mix.ts`, or `shared-core/src/evaluate` itself (an import of its index).
  if (parts[0] === 'shared-core' && parts[1] === 'src')
    return parts.length > 3 || (parts.length === 3 && !parts[2]!.includes('.')) ? `${parts[2]}/` : null;
  return (PACKAGE_DIRS as readonly string[]).includes(parts[0]!) ? `${parts[0]}/` : null;
}

const BUILTINS = new Set(builtinModules);
const CORE_NAME = '@dewmark/core';

/** What one import of `path` refers to: a token of the map, or a problem with the import itself. */
function targetOf(path: string, spec: string, names: Map<string, string>): { token: string } | { problem: string } {
  const from = nodeOf(path)!;
  if (spec.startsWith('.')) {
    const to = relative(root, join(root, dirname(path), spec))
      .split('\\')
      .join('/');
    const target = nodeOf(to);
    if (target === null) return { problem: `${path} imports '${spec}', outside every package's sources` };
    if (target === from) return { token: from };
    const fromCore = path.startsWith(`${CORE_SRC}/`);
    const toCore = to.startsWith(`${CORE_SRC}/`);
    if (fromCore && toCore) return { token: target };
    const name = toCore ? `${CORE_NAME}/${target.slice(0, -1)}` : names.get(target);
    return { problem: `${path} imports '${spec}' by a relative path into another package; import '${name}' instead` };
  }
  if (spec.startsWith(NODE) || BUILTINS.has(spec.split('/')[0]!)) return { token: NODE };
  if (spec === CORE_NAME || spec.startsWith(`${CORE_NAME}/`)) {
    const layer = spec.slice(CORE_NAME.length + 1);
    if (!/^[a-z]+$/.test(layer))
      return { problem: `${path} imports '${spec}'; import a layer by its entry point, '${CORE_NAME}/<layer>'` };
    return { token: `${layer}/` };
  }
  const parts = spec.split('/');
  return { token: spec.startsWith('@') ? `${parts[0]}/${parts[1]}` : parts[0]! };
}

interface Checked {
  /** Imports the map does not allow (and relative imports across packages). */
  violations: string[];
  /** The dependencies actually used, per node. */
  used: DependencyMap;
}

/** Checks the imports of `files` against `map`. */
function checkImports(
  files: { path: string; text: string }[],
  map: DependencyMap,
  names: Map<string, string>,
): Checked {
  const violations: string[] = [];
  const used: DependencyMap = new Map();
  const nameToNode = new Map([...names].map(([dir, name]) => [name, dir]));
  for (const { path, text } of files) {
    const node = nodeOf(path);
    if (node === null) {
      if (path.startsWith(`${CORE_SRC}/`))
        violations.push(`${path} is in no layer of the core; put it in the layer it belongs to`);
      continue;
    }
    const allowed = map.get(node);
    if (!allowed) {
      violations.push(
        `${path}: '${node}' has no row in ARCHITECTURE.md's tables; add one saying what it does and imports`,
      );
      continue;
    }
    for (const spec of importsOf(text)) {
      const t = targetOf(path, spec, names);
      if ('problem' in t) {
        violations.push(t.problem);
        continue;
      }
      if (t.token === node || nameToNode.get(t.token) === node) continue;
      if (!used.has(node)) used.set(node, new Set());
      used.get(node)!.add(t.token);
      if (!allowed.has(t.token))
        violations.push(`${path} imports '${spec}', but ARCHITECTURE.md does not let '${node}' import '${t.token}'`);
    }
  }
  return { violations, used };
}

/** Dependencies the map lists that no file uses (the table would say more than the code does). */
function unusedEntries(map: DependencyMap, used: DependencyMap): string[] {
  const out: string[] = [];
  for (const [node, deps] of map) {
    for (const d of deps)
      if (!used.get(node)?.has(d))
        out.push(`ARCHITECTURE.md lets '${node}' import '${d}', but none of its files does; remove it from the table`);
  }
  return out;
}

/** A cycle among the map's nodes (package names resolved to their folders), or null. */
function findCycle(map: DependencyMap, names: Map<string, string>): string[] | null {
  const nameToNode = new Map([...names].map(([dir, name]) => [name, dir]));
  const edges = (n: string) => [...(map.get(n) ?? [])].map((d) => nameToNode.get(d) ?? d).filter((d) => map.has(d));
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const visit = (n: string): string[] | null => {
    if (state.get(n) === 'done') return null;
    if (state.get(n) === 'open') return [...stack.slice(stack.indexOf(n)), n];
    state.set(n, 'open');
    stack.push(n);
    for (const d of edges(n)) {
      const c = visit(d);
      if (c) return c;
    }
    stack.pop();
    state.set(n, 'done');
    return null;
  };
  for (const n of map.keys()) {
    const c = visit(n);
    if (c) return c;
  }
  return null;
}

const shipped = [CORE_SRC, ...PACKAGE_DIRS.map((d) => `${d}/src`)];

function shippedFiles(): { path: string; text: string }[] {
  return shipped
    .flatMap((dir) => sourcesUnder(dir))
    .map((f) => ({ path: relative(root, f).split('\\').join('/'), text: readFileSync(f, 'utf8') }));
}

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
  const names = ['dist/cli.js', 'dist/server.js', 'dist/client.js', 'dist/web/server.js', 'dist/web/client.js'];
  if (!names.every((n) => existsSync(join(root, n)))) {
    const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
    if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  }
  return names.map((n) => join(root, n));
}

const map = readMap(readFileSync(join(root, 'ARCHITECTURE.md'), 'utf8'));
const names = packageNames();

describe('the dependency map of ARCHITECTURE.md', () => {
  it('has a row for every core layer and every package, and no row for anything else', () => {
    const layers = readdirSync(join(root, CORE_SRC)).filter((e) => statSync(join(root, CORE_SRC, e)).isDirectory());
    expect(layers.length).toBeGreaterThan(5);
    const expected = [...layers.map((l) => `${l}/`), ...PACKAGE_DIRS.map((d) => `${d}/`)].sort();
    expect([...map.keys()].sort()).toEqual(expected);
  });

  it('every import of every shipped source is allowed by it', () => {
    const files = shippedFiles();
    expect(files.length).toBeGreaterThan(50);
    expect(checkImports(files, map, names).violations).toEqual([]);
  });

  it('lists nothing the sources do not import (the table says what the code does)', () => {
    expect(unusedEntries(map, checkImports(shippedFiles(), map, names).used)).toEqual([]);
  });

  it('has no cycle', () => {
    expect(findCycle(map, names)).toBeNull();
  });

  it(
    'the core and the protocol import no Node module and no editor ' +
      'package; only the server knows LSP, only the client VS Code',
    () => {
      for (const [node, deps] of map) {
        const isCore = existsSync(join(root, CORE_SRC, node));
        if (isCore || node === 'protocol/')
          expect(
            [...deps].filter((d) => d === NODE || /^(vscode|@vscode\/)/.test(d)),
            node,
          ).toEqual([]);
        if (node !== 'server/')
          expect(
            [...deps].filter((d) => d.startsWith('vscode-languageserver')),
            node,
          ).toEqual([]);
        if (node !== 'client/')
          expect(
            [...deps].filter((d) => d === 'vscode' || d.startsWith('vscode-languageclient')),
            node,
          ).toEqual([]);
      }
    },
  );
});

describe('each rule of the map can fail', () => {
  /** How `node` would import `token` if it did. */
  function specFor(node: string, token: string): string {
    const nodeIsCore = existsSync(join(root, CORE_SRC, node));
    const tokenIsCore = existsSync(join(root, CORE_SRC, token));
    if (tokenIsCore) return nodeIsCore ? `../${token}index` : `${CORE_NAME}/${token.slice(0, -1)}`;
    if (token === NODE) return 'node:fs';
    return names.get(token) ?? token;
  }
  const fileIn = (node: string) =>
    existsSync(join(root, CORE_SRC, node)) ? `${CORE_SRC}/${node}made-up.ts` : `${node}src/made-up.ts`;

  it('an import outside its row is reported, for every row and every other module, Node and an editor package', () => {
    const missed: string[] = [];
    let tried = 0;
    for (const [node, allowed] of map) {
      for (const token of [...map.keys(), NODE, 'vscode', 'vscode-languageserver', 'psychrolib']) {
        if (token === node) continue;
        const asImported = names.get(token) ?? token;
        if (allowed.has(token) || allowed.has(asImported)) continue;
        const file = { path: fileIn(node), text: `import { x } from '${specFor(node, token)}';\n` };
        tried++;
        if (checkImports([file], map, names).violations.length !== 1) missed.push(`${node} → ${token}`);
      }
    }
    expect(tried).toBeGreaterThan(50);
    expect(missed).toEqual([]);
  });

  it('each kind of import is seen: import type, export from, import(), require(), side-effect import', () => {
    const kinds = [
      "import type { A } from 'vscode';",
      "export { b } from 'vscode';",
      "const c = await import('vscode');",
      "const d = require('vscode');",
      "import 'vscode';",
    ];
    for (const text of kinds)
      expect(checkImports([{ path: `${CORE_SRC}/units/made-up.ts`, text }], map, names).violations, text).toHaveLength(
        1,
      );
    // Words that only look like imports are not.
    const innocent = "// import x from 'vscode'\nconst s = \"import y from 'vscode'\";\n";
    expect(checkImports([{ path: `${CORE_SRC}/units/made-up.ts`, text: innocent }], map, names).violations).toEqual([]);
  });

  it('a relative import into another package is reported, even where the dependency is allowed', () => {
    const client = {
      path: 'client/src/made-up.ts',
      text: "import { SETTINGS_SECTION } from '../../protocol/src/index';\n",
    };
    expect(checkImports([client], map, names).violations).toEqual([
      "client/src/made-up.ts imports '../../protocol/src/index' by a " +
        "relative path into another package; import '@dewmark/protocol' instead",
    ]);
    const cli = {
      path: 'cli/src/made-up.ts',
      text: "import { parseNote } from '../../shared-core/src/notation/parse';\n",
    };
    expect(checkImports([cli], map, names).violations[0]).toContain("import '@dewmark/core/notation' instead");
  });

  it('a file inside a layer instead of its entry point is reported', () => {
    const file = {
      path: 'cli/src/made-up.ts',
      text: "import type { Analysis } from '@dewmark/core/evaluate/types';\n",
    };
    expect(checkImports([file], map, names).violations[0]).toContain(
      "import a layer by its entry point, '@dewmark/core/<layer>'",
    );
  });

  it('a folder without a row, or a core file in no layer, is reported', () => {
    const file = { path: `${CORE_SRC}/newlayer/made-up.ts`, text: "import { x } from '../text/index';\n" };
    expect(checkImports([file], map, names).violations[0]).toContain(
      "'newlayer/' has no row in ARCHITECTURE.md's tables",
    );
    const loose = { path: `${CORE_SRC}/index.ts`, text: "export { parseNote } from './notation/index';\n" };
    expect(checkImports([loose], map, names).violations).toEqual([
      `${CORE_SRC}/index.ts is in no layer of the core; put it in the layer it belongs to`,
    ]);
  });

  it('a listed dependency nothing uses is reported', () => {
    const more: DependencyMap = new Map([...map].map(([n, d]) => [n, new Set(d)]));
    more.get('physics/')!.add('text/');
    const used = checkImports(shippedFiles(), more, names).used;
    expect(unusedEntries(more, used)).toEqual([
      "ARCHITECTURE.md lets 'physics/' import 'text/', but none of its files does; remove it from the table",
    ]);
  });

  it('a cycle is reported, also through a package name', () => {
    const cyclic: DependencyMap = new Map([...map].map(([n, d]) => [n, new Set(d)]));
    cyclic.get('text/')!.add('service/');
    const c = findCycle(cyclic, names);
    expect(c?.[0]).toBe(c?.at(-1));
    expect(c).toContain('text/');
    const viaName: DependencyMap = new Map([...map].map(([n, d]) => [n, new Set(d)]));
    viaName.get('protocol/')!.add('@dewmark/files');
    viaName.get('files/')!.add('@dewmark/protocol');
    expect(findCycle(viaName, names)).toEqual(['protocol/', 'files/', 'protocol/']);
  });

  it('the table reader sees every row (a made-up table)', () => {
    const doc = [
      '| module | does | imports |',
      '|---|---|---|',
      '| `a/` | x | nothing |',
      '| `b/` | y, with `code` in it | `a/`, `node:` |',
      '',
      'text',
    ].join('\n');
    expect([...readMap(doc)].map(([n, d]) => [n, [...d]])).toEqual([
      ['a/', []],
      ['b/', ['a/', 'node:']],
    ]);
  });
});

describe('no dynamic code, no test oracle', () => {
  it('no eval or new Function in shipped sources, and no test oracle', () => {
    const bad: string[] = [];
    for (const { path, text } of shippedFiles()) {
      for (const [what, re] of DYNAMIC_CODE) if (re.test(text)) bad.push(`${path} uses ${what}`);
      if (importsOf(text).some((s) => s === 'psychrolib')) bad.push(`${path} imports the test oracle psychrolib`);
    }
    expect(bad).toEqual([]);
  });

  it('the dynamic-code patterns find what they look for (the scans can fail)', () => {
    const samples = [
      'x = eval("1")',
      'f = new Function("a", "return a")',
      'g = Function("return this")',
      "const vm = require('node:vm')",
      "setTimeout('alert(1)', 5)",
    ];
    expect(samples.map((t) => DYNAMIC_CODE.some(([, re]) => re.test(t)))).toEqual([true, true, true, true, true]);
    const innocent = [
      'obj.eval(x)',
      'isFunction(y)',
      'typeof f === "function"',
      'setTimeout(() => done(), 5)',
      'medieval(3)',
    ];
    expect(innocent.map((t) => DYNAMIC_CODE.some(([, re]) => re.test(t)))).toEqual([false, false, false, false, false]);
  });

  it('no dynamic code evaluation in the built bundles either, third-party code included', () => {
    const bad: string[] = [];
    for (const f of bundles()) {
      const text = readFileSync(f, 'utf8');
      expect(text.length, `${relative(root, f)} is a real bundle`).toBeGreaterThan(10_000);
      for (const [what, re] of DYNAMIC_CODE) {
        const m = re.exec(text);
        if (m)
          bad.push(`${relative(root, f)} uses ${what} near: ${text.slice(Math.max(0, m.index - 60), m.index + 60)}`);
      }
      if (/psychrolib|GetTWetBulbFromHumRatio/.test(text)) bad.push(`${relative(root, f)} contains the test oracle`);
    }
    expect(bad).toEqual([]);
  });
});
