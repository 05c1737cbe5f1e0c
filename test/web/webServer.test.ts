/**
 * The web build of the language server (dist/web/server.js, the server the browser entry runs in
 * a Web Worker) over LSP, in a worker thread with Node's globals hidden (./harness): initialize,
 * didOpen, hover, inline hints, diagnostics, the project file read through the client, no
 * workspace check, shutdown and exit. Its answers are compared with the Node server's
 * (`dewmark-language-server --stdio`) for the same note: one server, two builds.
 *
 * Figures: ASHRAE HoF 2017 SI Ch.1 Example 1 (40 °C db, 20 °C wb at 101.325 kPa → W 6.5 g/kg ±0.1,
 * h 56.7 kJ/kg ±0.1, dp 7 °C ±0.5, rh 14 % ±1; tolerances as the PsychroLib test suite uses for this
 * example), plus half a shown digit for the display rounding.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  CHECK_WORKSPACE_METHOD,
  READ_FILES_METHOD,
  type ReadFilesParams,
  type ReadFilesResult,
} from '@dewmark/protocol';
import { FULL_CAPABILITIES, positionOf, startServer, tableValue, type Session } from '../protocol/harness';
import { checkExample1 } from '../fixtures/e2e/expected';
import { NODE_ONLY_GLOBALS, startWebServer } from './harness';

const EX1 = { w: [6.5, 0.105], h: [56.7, 0.105], dp: [7, 0.55], rh: [14, 1.05] } as const;
const within = (v: number, [e, tol]: readonly [number, number]) => Math.abs(v - e) <= tol + 1e-9;

// An invented note: Example 1's state, a state with a wet-bulb above its dry-bulb, a mix.
const NOTE = [
  '# Quayside Depot — AHU-1',
  '',
  '```air',
  'state OA: db=40C wb=20C',
  'state RA: db=24C rh=50%',
  'state BAD: db=20C wb=25C',
  'mix MA: OA 30% + RA 70%',
  '```',
  '',
].join('\n');

/** A workspace folder in a virtual file system (as a repository opened in the browser-based editor). */
const FOLDER = 'vscode-vfs://github/dewmark-demo/quayside';
const NOTE_URI = `${FOLDER}/calcs/ahu-1.md`;
/** A note in another folder with a project file of its own that sets IP units. */
const IP_URI = `${FOLDER}/imperial/ahu-1.md`;
/** What the client's file system holds (the project files). */
const FILES: Record<string, string> = {
  [`${FOLDER}/imperial/dewmark.json`]: JSON.stringify({ units: 'IP', elevation: '1600 m' }),
  [`${FOLDER}/dewmark.json`]: JSON.stringify({ rules: { 'wb-above-db': 'warning' } }),
};

interface Diag {
  code?: string;
  severity?: number;
  message: string;
  range: unknown;
}
interface Hint {
  position: { line: number; character: number };
  label: string | { value: string }[];
}
const hintText = (h: Hint) => (typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join(''));

/** Resolves with the worker's exit code once it has ended. */
const ended = (s: Session) =>
  new Promise<number | null>((resolve) =>
    s.proc.exitCode !== null ? resolve(s.proc.exitCode) : s.proc.on('exit', (code) => resolve(code)),
  );

let web: Session;
const asked: string[][] = [];

beforeAll(async () => {
  web = startWebServer();
  web.connection.onRequest(READ_FILES_METHOD, (p: ReadFilesParams): ReadFilesResult => {
    asked.push(p.uris);
    return { texts: p.uris.map((u) => FILES[u] ?? null) };
  });
  web.configuration = () => ({});
});

afterAll(() => web?.kill());

describe('the web build of the language server (a worker without Node)', () => {
  let init: { capabilities: Record<string, any>; serverInfo?: { name: string } };

  it('initializes, offering the editor features and no workspace check', async () => {
    init = await web.initialize(FULL_CAPABILITIES, { workspaceFolders: [{ uri: FOLDER, name: 'quayside' }] });
    expect(init.serverInfo?.name).toBe('dewmark-language-server');
    expect(init.capabilities.hoverProvider).toBe(true);
    expect(init.capabilities.inlayHintProvider).toBeTruthy();
    expect(init.capabilities.diagnosticProvider).toBeTruthy();
    expect(init.capabilities.experimental.dewmark.noteStatus).toBe('dewmark/noteStatus');
    expect(init.capabilities.experimental.dewmark.checkWorkspace).toBeUndefined();
  });

  it(`answers a hover on an opened note (ASHRAE HoF 2017 SI Ch.1 Example 1)`, async () => {
    await web.open(NOTE_URI, NOTE, 1);
    const h = await web.request<{ contents: { kind: string; value: string } }>('textDocument/hover', {
      textDocument: { uri: NOTE_URI },
      position: positionOf(NOTE, 'state O'),
    });
    expect(h.contents.kind).toBe('markdown');
    for (const key of ['w', 'h', 'dp', 'rh'] as const)
      expect(within(tableValue(h.contents.value, key), EX1[key]), `${key} in:\n${h.contents.value}`).toBe(true);
    expect(h.contents.value).toContain('Design aid only');
  });

  it('reports diagnostics, with the project file above the note (read through the client) applied', async () => {
    const r = await web.request<{ items: Diag[] }>('textDocument/diagnostic', { textDocument: { uri: NOTE_URI } });
    // An error by default; the workspace folder's dewmark.json makes it a warning.
    expect(r.items.map((d) => [d.code, d.severity])).toEqual([['wb-above-db', 2]]);
    // Asked for the note's folder and each parent up to the workspace folder; nothing above it.
    expect(asked.flat()).toEqual([`${FOLDER}/calcs/dewmark.json`, `${FOLDER}/dewmark.json`]);
  });

  it('gives inline hints', async () => {
    const hints = await web.request<Hint[]>('textDocument/inlayHint', {
      textDocument: { uri: NOTE_URI },
      range: { start: { line: 0, character: 0 }, end: { line: 9, character: 0 } },
    });
    const oa = hints.find((h) => h.position.line === 3);
    expect(oa, JSON.stringify(hints)).toBeDefined();
    expect(checkExample1(hintText(oa!)), hintText(oa!)).toEqual([]);
  });

  it("takes the nearest project file: a folder's own dewmark.json sets IP units and the elevation", async () => {
    await web.open(IP_URI, NOTE, 1);
    const h = await web.request<{ contents: { value: string } }>('textDocument/hover', {
      textDocument: { uri: IP_URI },
      position: positionOf(NOTE, 'state O'),
    });
    expect(h.contents.value).toContain('°F');
    // The hover names the file, relative to the workspace folder.
    expect(h.contents.value).toContain('imperial/dewmark.json: elevation 1600 m');
    expect(asked.flat()).toContain(`${FOLDER}/imperial/dewmark.json`);
    // The workspace folder's file was asked for once only (kept until a change).
    expect(asked.flat().filter((u) => u === `${FOLDER}/dewmark.json`)).toHaveLength(1);
  });

  it('has no workspace check: the request is unknown to it', async () => {
    await expect(web.request(CHECK_WORKSPACE_METHOD, {})).rejects.toMatchObject({ code: -32601 });
  });

  it('shuts down, and the worker ends after exit', async () => {
    expect(await web.shutdown()).toBe(0);
  });
});

describe('the worker harness', () => {
  it('hides Node: a script that reaches for a Node global fails in it', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'dewmark-web-'));
    try {
      for (const name of NODE_ONLY_GLOBALS) {
        const script = join(dir, `${name}.js`);
        writeFileSync(script, `if (typeof ${name} !== 'undefined') throw new Error('${name} is there');\nclose();\n`);
        const s = startWebServer(script);
        expect(await ended(s), `${name}: ${s.stderr}`).toBe(0);
        expect(s.stderr, name).toBe('');
      }
      writeFileSync(join(dir, 'env.js'), 'process.env.HOME;\n');
      const s = startWebServer(join(dir, 'env.js'));
      expect(await ended(s)).not.toBe(0);
      expect(s.stderr).toMatch(/Cannot read properties of undefined \(reading 'env'\)/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('the web build answers as the Node server does', () => {
  let node: Session;
  let webAgain: Session;
  const dirs: string[] = [];

  beforeAll(async () => {
    node = startServer();
    webAgain = startWebServer();
    for (const s of [node, webAgain]) {
      s.configuration = () => ({});
      await s.initialize(FULL_CAPABILITIES);
    }
  });
  afterAll(async () => {
    for (const s of [node, webAgain]) await s?.shutdown().catch(() => s.kill());
    for (const d of dirs) rmSync(d, { recursive: true, force: true });
  });

  it('the same hover, hints, diagnostics and symbols for the same note', async () => {
    // A local note outside any workspace folder: neither server reads a project file for it.
    const dir = mkdtempSync(join(tmpdir(), 'dewmark-web-'));
    dirs.push(dir);
    writeFileSync(join(dir, 'note.md'), NOTE);
    const uri = `file://${dir}/note.md`;
    const ask = async (s: Session) => {
      await s.open(uri, NOTE, 1);
      const td = { textDocument: { uri } };
      return {
        hover: await s.request('textDocument/hover', { ...td, position: positionOf(NOTE, 'mix M') }),
        hints: await s.request('textDocument/inlayHint', {
          ...td,
          range: { start: { line: 0, character: 0 }, end: { line: 9, character: 0 } },
        }),
        diagnostics: await s.request('textDocument/diagnostic', td),
        symbols: await s.request('textDocument/documentSymbol', td),
      };
    };
    const [fromNode, fromWeb] = [await ask(node), await ask(webAgain)];
    expect((fromNode.hover as { contents: { value: string } }).contents.value).toContain('mix MA');
    expect((fromNode.diagnostics as { items: unknown[] }).items.length).toBeGreaterThan(0);
    expect(fromWeb).toEqual(fromNode);
  });
});
