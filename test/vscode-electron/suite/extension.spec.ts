/**
 * Integration tests inside a real VS Code (run by test/vscode-electron/run.ts through
 * @vscode/test-electron): the extension activates on the fixture note, and hovers, inline hints,
 * diagnostics and a quick fix arrive through VS Code's own provider commands. Expected figures:
 * ASHRAE HoF 2017 SI Ch.1 Example 1 (copied with tolerances in test/fixtures/e2e/expected.ts).
 */
import * as assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, it } from 'mocha';
import * as vscode from 'vscode';
import { EXAMPLE_1, FIXTURE_NOTE, INFEASIBLE, checkExample1 } from '../../fixtures/e2e/expected';

interface DewmarkApi {
  ready(): Promise<void>;
}

/** Polls `probe` until it returns a value (not undefined), or fails after `ms` with `what`. */
async function waitFor<T>(what: string, probe: () => T | undefined | Promise<T | undefined>, ms = 30_000): Promise<T> {
  const end = Date.now() + ms;
  let last: unknown;
  for (;;) {
    try {
      const v = await probe();
      if (v !== undefined) return v;
    } catch (err) {
      last = err;
    }
    if (Date.now() > end)
      throw new Error(`timed out after ${ms} ms waiting for ${what}${last ? ` (last error: ${String(last)})` : ''}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

function lineOf(doc: vscode.TextDocument, starts: string): number {
  for (let i = 0; i < doc.lineCount; i++) if (doc.lineAt(i).text.startsWith(starts)) return i;
  throw new Error(`no line starting with "${starts}" in ${doc.uri.fsPath}`);
}

function labelText(hint: vscode.InlayHint): string {
  return typeof hint.label === 'string' ? hint.label : hint.label.map((p) => p.value).join('');
}

function hoverText(hovers: vscode.Hover[]): string {
  return hovers
    .flatMap((h) => h.contents)
    .map((c) => (typeof c === 'string' ? c : 'value' in c ? c.value : ''))
    .join('\n');
}

describe('Dewmark in VS Code', () => {
  let doc: vscode.TextDocument;

  before(async () => {
    const folder = vscode.workspace.workspaceFolders?.[0];
    assert.ok(folder, 'the test workspace folder is open');
    doc = await vscode.workspace.openTextDocument(vscode.Uri.file(join(folder.uri.fsPath, FIXTURE_NOTE)));
    await vscode.window.showTextDocument(doc);
    assert.equal(doc.languageId, 'markdown');
    const ext = vscode.extensions.getExtension<DewmarkApi>('dewmark.dewmark');
    assert.ok(ext, 'the extension dewmark.dewmark is installed in the development host');
    const api = await ext.activate();
    await api.ready();
  });

  after(async () => {
    await vscode.commands.executeCommand('workbench.action.files.revert');
    await vscode.workspace.getConfiguration('dewmark').update('units', undefined, vscode.ConfigurationTarget.Global);
  });

  it('contributes its commands', async () => {
    const all = await vscode.commands.getCommands(true);
    for (const id of [
      'dewmark.switchUnits',
      'dewmark.checkWorkspace',
      'dewmark.showChart',
      'dewmark.restartServer',
      'dewmark.showLog',
    ]) {
      assert.ok(all.includes(id), `${id} is registered`);
    }
  });

  it(`shows inline hints with the computed values (${EXAMPLE_1.source})`, async () => {
    const line = lineOf(doc, EXAMPLE_1.line);
    const label = await waitFor('an inline hint on the OA line', async () => {
      const hints = await vscode.commands.executeCommand<vscode.InlayHint[]>(
        'vscode.executeInlayHintProvider',
        doc.uri,
        new vscode.Range(0, 0, doc.lineCount, 0),
      );
      const h = hints.find((x) => x.position.line === line);
      return h ? labelText(h) : undefined;
    });
    assert.deepEqual(checkExample1(label), [], `hint "${label}"`);
  });

  it('shows a hover with the property table, the pressure and the method', async () => {
    const line = lineOf(doc, EXAMPLE_1.line);
    const pos = new vscode.Position(line, doc.lineAt(line).text.indexOf('OA') + 1);
    const text = await waitFor('a hover on OA', async () => {
      const hovers = await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', doc.uri, pos);
      const t = hoverText(hovers);
      return t.includes('state OA') ? t : undefined;
    });
    // Figures first, two to a row: key, value, unit.
    for (const part of ['`w`', '`h`', '`dp`', '`rh`', 'g/kg', 'Pressure: 101.325 kPa', 'Method: ASHRAE']) {
      assert.ok(text.includes(part), `hover has "${part}":\n${text}`);
    }
  });

  it('reports the infeasible state as an error with its code, and fixes it with the quick fix', async () => {
    const line = lineOf(doc, INFEASIBLE.before);
    const diag = await waitFor(`a ${INFEASIBLE.code} diagnostic`, () =>
      vscode.languages.getDiagnostics(doc.uri).find((d) => {
        const code = typeof d.code === 'object' ? d.code.value : d.code;
        return code === INFEASIBLE.code && d.range.start.line === line;
      }),
    );
    assert.equal(diag.severity, vscode.DiagnosticSeverity.Error);
    assert.equal(diag.source, 'dewmark');
    const actions = await vscode.commands.executeCommand<vscode.CodeAction[]>(
      'vscode.executeCodeActionProvider',
      doc.uri,
      diag.range,
      vscode.CodeActionKind.QuickFix.value,
    );
    const fix = actions.find((a) => a.title.startsWith(INFEASIBLE.fixTitle));
    assert.ok(fix?.edit, `a quick fix "${INFEASIBLE.fixTitle}…" among: ${actions.map((a) => a.title).join(' | ')}`);
    assert.ok(await vscode.workspace.applyEdit(fix.edit));
    assert.ok(doc.lineAt(line).text.startsWith(INFEASIBLE.after), `line after the fix: "${doc.lineAt(line).text}"`);
    await waitFor('the diagnostic to clear after the fix', () =>
      vscode.languages
        .getDiagnostics(doc.uri)
        .some((d) => (typeof d.code === 'object' ? d.code.value : d.code) === INFEASIBLE.code)
        ? undefined
        : true,
    );
  });

  it('switches the result units with the Dewmark command', async () => {
    const line = lineOf(doc, EXAMPLE_1.line);
    await vscode.commands.executeCommand('dewmark.switchUnits');
    const label = await waitFor('IP figures in the OA hint', async () => {
      const hints = await vscode.commands.executeCommand<vscode.InlayHint[]>(
        'vscode.executeInlayHintProvider',
        doc.uri,
        new vscode.Range(0, 0, doc.lineCount, 0),
      );
      const t = hints
        .filter((x) => x.position.line === line)
        .map(labelText)
        .join(' ');
      return t.includes('°F') ? t : undefined;
    });
    assert.ok(!label.includes('°C'), `no °C left in "${label}"`);
    await vscode.commands.executeCommand('dewmark.switchUnits');
  });

  it('opens the chart of the note in a webview beside it', async () => {
    await vscode.window.showTextDocument(doc);
    await vscode.commands.executeCommand('dewmark.showChart');
    const tab = await waitFor('a chart tab', () =>
      vscode.window.tabGroups.all
        .flatMap((g) => g.tabs)
        .find((t) => t.input instanceof vscode.TabInputWebview && t.label === `Chart: ${FIXTURE_NOTE}`),
    );
    assert.ok(
      tab.group.viewColumn !==
        vscode.window.tabGroups.all.find((g) =>
          g.tabs.some((t) => t.input instanceof vscode.TabInputText && t.input.uri.toString() === doc.uri.toString()),
        )?.viewColumn,
      'beside the note',
    );
  });
});
