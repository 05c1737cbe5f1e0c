/**
 * Every feature through the real protocol: a spawned `dewmark-language-server --stdio` driven with
 * vscode-jsonrpc. Computed figures are checked against published values (source beside each).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CancellationTokenSource } from 'vscode-jsonrpc/node';
import type { NoteStatusResult } from '@dewmark/protocol';
import {
  cursors,
  FULL_CAPABILITIES,
  positionOf,
  startServer,
  tableValue,
  type Position,
  type Range,
  type Session,
} from './harness';

// ASHRAE HoF 2017 SI Ch.1 Example 1: 40 °C db, 20 °C wb at 101.325 kPa → W 0.0065 kg/kg (±0.0001),
// h 56.7 kJ/kg (±0.1), dp 7 °C (±0.5), RH 14 % (±1) — tolerances as the PsychroLib test suite uses
// for this example; half a shown digit is added for the display rounding.
const EX1 = { w: [6.5, 0.105], h: [56.7, 0.105], dp: [7, 0.55], rh: [14, 1.05] } as const;

const NOTE = [
  '# Harbour Street Lab — AHU-2', // 0
  '', // 1
  '```air', // 2
  'site: p=101.325kPa', // 3
  'state OA: db=40C wb=20C        # hot, dry intake air', // 4
  'state RA: db=24C rh=50%', // 5
  'state LOG7: db=20C wb=25C      # as copied from the log', // 6
  'mix MA: OA 25% + RA 75%', // 7
  'state SA: db=13C rh=80%', // 8
  'process CC: MA -> SA m=5kg/s', // 9
  '```', // 10
  '', // 11
].join('\n');

const URI = 'file:///work-notes/ahu2.md';

function within(value: number, [expected, tol]: readonly [number, number]): boolean {
  return Math.abs(value - expected) <= tol + 1e-9;
}

interface Diag {
  range: Range;
  code?: string;
  source?: string;
  message: string;
  severity?: number;
}

let s: Session;

beforeAll(async () => {
  s = startServer();
  s.configuration = (item) => (item.scopeUri?.endsWith('-ip.md') ? { units: 'IP' } : {});
  await s.initialize(FULL_CAPABILITIES);
  await s.open(URI, NOTE);
});

afterAll(async () => {
  if (s) {
    expect(await s.shutdown()).toBe(0);
    s.kill();
  }
});

describe('pull diagnostics', () => {
  it(
    'reports the evaluator diagnostics with codes, then "unchanged" ' +
      'for the same version, then the new set after an edit',
    async () => {
      const first = await s.request<{ kind: string; resultId: string; items: Diag[] }>('textDocument/diagnostic', {
        textDocument: { uri: URI },
      });
      expect(first.kind).toBe('full');
      expect(first.resultId).toBeTruthy();
      const wb = first.items.find((d) => d.code === 'wb-above-db');
      expect(wb).toBeDefined();
      expect(wb!.source).toBe('dewmark');
      expect(wb!.severity).toBe(1);
      expect(wb!.range.start.line).toBe(6);

      const again = await s.request<{ kind: string; resultId: string }>('textDocument/diagnostic', {
        textDocument: { uri: URI },
        previousResultId: first.resultId,
      });
      expect(again).toEqual({ kind: 'unchanged', resultId: first.resultId });

      // Incremental change: make LOG7 feasible (25 → 15), two edits in one notification applied in order.
      await s.change(URI, 2, [
        { range: { start: { line: 6, character: 22 }, end: { line: 6, character: 24 } }, text: '1' },
        { range: { start: { line: 6, character: 22 }, end: { line: 6, character: 23 } }, text: '15' },
      ]);
      const after = await s.request<{ kind: string; resultId: string; items: Diag[] }>('textDocument/diagnostic', {
        textDocument: { uri: URI },
        previousResultId: first.resultId,
      });
      expect(after.kind).toBe('full');
      expect(after.resultId).not.toBe(first.resultId);
      expect(after.items.some((d) => d.code === 'wb-above-db')).toBe(false);
      // Restore the note for the other tests (version 3).
      await s.change(URI, 3, [
        { range: { start: { line: 6, character: 22 }, end: { line: 6, character: 24 } }, text: '25' },
      ]);
      const restored = await s.request<{ items: Diag[] }>('textDocument/diagnostic', { textDocument: { uri: URI } });
      expect(restored.items.some((d) => d.code === 'wb-above-db')).toBe(true);
    },
  );
});

describe('hover', () => {
  it(`shows ASHRAE HoF 2017 SI Ch.1 Example 1 with pressure basis, datum, method and caution`, async () => {
    const h = await s.request<{ contents: { kind: string; value: string }; range: Range }>('textDocument/hover', {
      textDocument: { uri: URI },
      position: positionOf(NOTE, 'state O', false),
    });
    expect(h.contents.kind).toBe('markdown');
    const md = h.contents.value;
    for (const key of ['w', 'h', 'dp', 'rh'] as const) {
      expect(
        within(tableValue(md, key), EX1[key]),
        `${key}: ${tableValue(md, key)} (ASHRAE HoF 2017 SI Ch.1 Example 1)`,
      ).toBe(true);
    }
    expect(md).toContain('Pressure: 101.325 kPa — site line');
    expect(md).toContain('Enthalpy datum: dry air 0 at 0 °C');
    expect(md).toContain('ASHRAE Handbook—Fundamentals Ch. 1, ideal-gas; ice below 0 °C');
    expect(md).toContain('Design aid only');
    expect(h.range).toEqual({ start: { line: 4, character: 6 }, end: { line: 4, character: 8 } });
  });

  it('answers null where there is nothing to say', async () => {
    expect(
      await s.request('textDocument/hover', { textDocument: { uri: URI }, position: { line: 0, character: 3 } }),
    ).toBeNull();
  });
});

describe('inlay hints', () => {
  it('gives one hint per statement in the range, at the line end, with Example 1 figures', async () => {
    const hints = await s.request<{ position: Position; label: string; paddingLeft: boolean }[]>(
      'textDocument/inlayHint',
      {
        textDocument: { uri: URI },
        range: { start: { line: 4, character: 0 }, end: { line: 5, character: 0 } },
      },
    );
    expect(hints).toHaveLength(1);
    const [hint] = hints;
    expect(hint!.position).toEqual({ line: 4, character: NOTE.split('\n')[4]!.length });
    expect(hint!.paddingLeft).toBe(true);
    const fig = (key: string, unit: string) =>
      Number(new RegExp(`${key}[ \u00a0](-?[\\d.]+)[ \u00a0]${unit}`).exec(hint!.label)?.[1]);
    expect(within(fig('w', 'g/kg'), EX1.w)).toBe(true); // ASHRAE HoF 2017 SI Ch.1 Example 1
    expect(within(fig('h', 'kJ/kg'), EX1.h)).toBe(true);
    expect(within(fig('dp', '°C'), EX1.dp)).toBe(true);
    expect(within(fig('rh', '%'), EX1.rh)).toBe(true);
  });

  it('labels the process with its kind and duty', async () => {
    const hints = await s.request<{ position: Position; label: string }[]>('textDocument/inlayHint', {
      textDocument: { uri: URI },
      range: { start: { line: 0, character: 0 }, end: { line: 11, character: 0 } },
    });
    const process = hints.find((h) => h.position.line === 9);
    // Inside each figure the spaces are no-break spaces, so a wrap falls only at ' · '.
    expect(process?.label).toMatch(
      new RegExp(
        /^cooling\u00a0and\u00a0dehumidifying · [\d.]+\u00a0kW\u00a0removed · /.source +
          /SHR\u00a0[\d.]+ · [\d.]+\u00a0kg\/h\u00a0condensate$/.source,
      ),
    );
    expect(hints.some((h) => h.position.line === 6)).toBe(false); // LOG7 is infeasible: no figures for it
  });
});

describe('completion', () => {
  it('offers units after a number and names defined earlier', async () => {
    const units = await s.request<{
      items: { label: string; kind: number; textEdit: { range: Range; newText: string } }[];
    }>('textDocument/completion', {
      textDocument: { uri: URI },
      position: { line: 5, character: 'state RA: db=24'.length },
    });
    expect(units.items.map((i) => i.label)).toEqual(['C', 'F', 'K', 'R']);
    expect(units.items[0]!.textEdit.range).toEqual({
      start: { line: 5, character: 15 },
      end: { line: 5, character: 16 },
    });

    const names = await s.request<{ items: { label: string }[] }>('textDocument/completion', {
      textDocument: { uri: URI },
      position: { line: 9, character: 'process CC: '.length },
    });
    expect(names.items.map((i) => i.label)).toEqual(['OA', 'RA', 'LOG7', 'MA', 'SA']);
  });
});

describe('document symbols', () => {
  it('nests the states under the heading', async () => {
    const symbols = await s.request<{ name: string; kind: number; children?: { name: string; kind: number }[] }[]>(
      'textDocument/documentSymbol',
      { textDocument: { uri: URI } },
    );
    expect(symbols.map((x) => x.name)).toEqual(['Harbour Street Lab — AHU-2']);
    expect(symbols[0]!.children!.map((c) => c.name)).toEqual(['site', 'OA', 'RA', 'LOG7', 'MA', 'SA', 'CC']);
  });
});

describe('definition, references, rename', () => {
  const onMA = { line: 9, character: 'process CC: M'.length };

  it('goes to the definition and finds the references', async () => {
    const def = await s.request<{ uri: string; range: Range }>('textDocument/definition', {
      textDocument: { uri: URI },
      position: onMA,
    });
    expect(def).toEqual({ uri: URI, range: { start: { line: 7, character: 4 }, end: { line: 7, character: 6 } } });
    const refs = await s.request<{ range: Range }[]>('textDocument/references', {
      textDocument: { uri: URI },
      position: { line: 5, character: 7 },
      context: { includeDeclaration: true },
    });
    expect(refs.map((r) => r.range.start.line)).toEqual([5, 7]);
  });

  it('renames with a versioned edit, and refuses a clash with a clear message', async () => {
    const prep = await s.request<{ range: Range; placeholder: string }>('textDocument/prepareRename', {
      textDocument: { uri: URI },
      position: onMA,
    });
    expect(prep.placeholder).toBe('MA');
    const edit = await s.request<{
      documentChanges: { textDocument: { uri: string; version: number }; edits: { range: Range; newText: string }[] }[];
    }>('textDocument/rename', {
      textDocument: { uri: URI },
      position: onMA,
      newName: 'MIXED',
    });
    expect(edit.documentChanges[0]!.textDocument).toEqual({ uri: URI, version: 3 });
    expect(edit.documentChanges[0]!.edits.map((e) => e.range.start.line).sort()).toEqual([7, 9]);
    expect(edit.documentChanges[0]!.edits.every((e) => e.newText === 'MIXED')).toBe(true);
    await expect(
      s.request('textDocument/rename', { textDocument: { uri: URI }, position: onMA, newName: 'OA' }),
    ).rejects.toThrow(/already defined on line 5/);
    await expect(
      s.request('textDocument/rename', { textDocument: { uri: URI }, position: onMA, newName: '9x' }),
    ).rejects.toThrow(/not a valid name/);
  });
});

describe('code actions', () => {
  it('offers the swap fix for the wet-bulb above the dry-bulb, tied to its diagnostic', async () => {
    const diags = (await s.request<{ items: Diag[] }>('textDocument/diagnostic', { textDocument: { uri: URI } })).items;
    const wb = diags.find((d) => d.code === 'wb-above-db')!;
    const actions = await s.request<
      {
        title: string;
        kind: string;
        isPreferred?: boolean;
        diagnostics?: Diag[];
        edit: { changes: Record<string, { range: Range; newText: string }[]> };
      }[]
    >('textDocument/codeAction', {
      textDocument: { uri: URI },
      range: wb.range,
      context: { diagnostics: [wb], only: ['quickfix'] },
    });
    expect(actions.every((a) => a.kind === 'quickfix')).toBe(true);
    const swap = actions.find((a) => a.title.startsWith('Swap the dry-bulb and wet-bulb values'));
    expect(swap?.isPreferred).toBe(true);
    expect(swap?.diagnostics).toEqual([wb]);
    const edits = swap!.edit.changes[URI]!;
    expect(edits.map((e) => e.newText).sort()).toEqual(['20C', '25C']);
    for (const e of edits) expect(e.range.start.line).toBe(6);
  });

  it('offers the unit-system rewrite as a refactoring', async () => {
    const actions = await s.request<{ title: string; kind: string }[]>('textDocument/codeAction', {
      textDocument: { uri: URI },
      range: { start: { line: 5, character: 0 }, end: { line: 5, character: 0 } },
      context: { diagnostics: [] },
    });
    expect(actions.map((a) => [a.kind, a.title.split(' (')[0]])).toEqual([
      ['refactor.rewrite', 'Convert the written values of state RA to IP'],
    ]);
  });
});

describe('settings, cancellation and custom requests', () => {
  it('asks workspace/configuration per document and shows IP where the scope says so', async () => {
    const uri = 'file:///work-notes/plant-ip.md';
    await s.open(uri, '```air\nstate OA: db=40C wb=20C\n```\n');
    const h = await s.request<{ contents: { value: string } }>('textDocument/hover', {
      textDocument: { uri },
      position: { line: 1, character: 7 },
    });
    expect(h.contents.value).toContain('Enthalpy datum: dry air 0 at 0 °F');
    // 40 °C = 104 °F exactly (°F = °C × 9/5 + 32, by definition).
    expect(tableValue(h.contents.value, 'db')).toBe(104);
    expect(s.configurationRequests).toContainEqual({ scopeUri: uri, section: 'dewmark' });
  });

  it('answers a request cancelled while it waits with RequestCancelled', async () => {
    const uri = 'file:///work-notes/slow.md';
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const asked = s.configurationRequests.length;
    s.configuration = (item) => gate.then(() => (item.scopeUri?.endsWith('-ip.md') ? { units: 'IP' } : {}));
    await s.open(uri, '```air\nstate OA: db=40C wb=20C\n```\n');
    const source = new CancellationTokenSource();
    const pending = s.connection.sendRequest(
      'textDocument/hover',
      { textDocument: { uri }, position: { line: 1, character: 7 } },
      source.token,
    );
    await s.until('the configuration request', () => s.configurationRequests.length > asked);
    // The cancellation goes out before the configuration answer, so the server sees it first.
    source.cancel();
    release();
    await expect(pending).rejects.toMatchObject({ code: -32800 }); // LSP RequestCancelled
    s.configuration = (item) => (item.scopeUri?.endsWith('-ip.md') ? { units: 'IP' } : {});
  });

  it('answers ContentModified when the document changed while the request waited', async () => {
    const uri = 'file:///work-notes/edited.md';
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const asked = s.configurationRequests.length;
    s.configuration = () => gate.then(() => ({}));
    await s.open(uri, '```air\nstate OA: db=40C wb=20C\n```\n', 1);
    const pending = s.request('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 7 } });
    await s.until('the configuration request', () => s.configurationRequests.length > asked);
    await s.change(uri, 2, [
      { range: { start: { line: 1, character: 13 }, end: { line: 1, character: 14 } }, text: '3' },
    ]);
    release();
    await expect(pending).rejects.toMatchObject({ code: -32801 }); // LSP ContentModified
    // Asked again, it answers for the new text (db=30C).
    const h = await s.request<{ contents: { value: string } }>('textDocument/hover', {
      textDocument: { uri },
      position: { line: 1, character: 7 },
    });
    expect(tableValue(h.contents.value, 'db')).toBe(30);
    s.configuration = (item) => (item.scopeUri?.endsWith('-ip.md') ? { units: 'IP' } : {});
  });

  it('answers dewmark/noteStatus with the units and the pressure basis', async () => {
    const status = await s.request<NoteStatusResult>('dewmark/noteStatus', { textDocument: { uri: URI } });
    expect(status).toMatchObject({ units: 'SI', unitsSource: 'setting', pressureLabel: 'site 101.325 kPa' });
  });

  it('reads the cursor markers of the harness (sanity of the test helper)', () => {
    expect(cursors('ab|c\nd|e')).toEqual({
      text: 'abc\nde',
      at: [
        { line: 0, character: 2 },
        { line: 1, character: 1 },
      ],
    });
  });
});

describe('property references through the protocol', () => {
  const REFS = 'file:///work-notes/refs.md';
  // Line numbers of the note below (0-based).
  const TEXT = [
    '```air',
    'state OA: db=40C wb=20C',
    'state PH: db=OA.db+2K w=OA.w',
    'state X: db=20C w=',
    '```',
    '',
  ].join('\n');

  it("hovers on OA.w with the value's origin, goes to OA, renames into the reference, completes NAME.key", async () => {
    await s.open(REFS, TEXT);
    // ASHRAE HoF 2017 SI Ch.1 Example 1 (see EX1 above): W of OA is 6.5 g/kg ±0.1.
    const h = await s.request<{ contents: { value: string } }>('textDocument/hover', {
      textDocument: { uri: REFS },
      position: { line: 2, character: 'state PH: db=OA.db+2K w=OA.'.length },
    });
    const head = /^`w=OA\.w` — w from OA: (\d+\.\d+) g\/kg$/.exec(h.contents.value.split('\n')[0]!);
    expect(head, h.contents.value).not.toBeNull();
    expect(within(Number(head![1]), EX1.w)).toBe(true);

    const def = await s.request<{ uri: string; range: Range }>('textDocument/definition', {
      textDocument: { uri: REFS },
      position: { line: 2, character: 'state PH: db=OA.d'.length },
    });
    expect(def).toEqual({ uri: REFS, range: { start: { line: 1, character: 6 }, end: { line: 1, character: 8 } } });

    const edit = await s.request<{ documentChanges: { edits: { range: Range; newText: string }[] }[] }>(
      'textDocument/rename',
      {
        textDocument: { uri: REFS },
        position: { line: 1, character: 7 },
        newName: 'OUT',
      },
    );
    expect(edit.documentChanges[0]!.edits.map((e) => [e.range.start.line, e.range.start.character])).toEqual([
      [1, 6],
      [2, 13],
      [2, 24],
    ]);

    const names = await s.request<{ items: { label: string }[] }>('textDocument/completion', {
      textDocument: { uri: REFS },
      position: { line: 3, character: 'state X: db=20C w='.length },
    });
    expect(names.items.map((i) => i.label)).toEqual(['OA.w', 'PH.w']);
  });
});
