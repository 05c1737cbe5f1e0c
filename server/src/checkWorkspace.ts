/**
 * The custom `dewmark/checkWorkspace` request: reads every Markdown note under the workspace
 * folders (reading only; nothing is written), analyses it, and pushes its diagnostics. Reports
 * work-done progress and stops between files when cancelled.
 */
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { type CancellationToken, type WorkDoneProgressReporter } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { analyzeText, countDiagnostics } from '@dewmark/core/service';
import type { ServerContext } from './context';
import type { Diagnostics } from './diagnostics';
import { toLspDiagnostics } from './diagnostics';
import {
  CHECK_WORKSPACE_METHOD,
  type CheckedNote,
  type CheckWorkspaceParams,
  type CheckWorkspaceResult,
} from '@dewmark/protocol';
import { cancelled, runSafe } from './safe';

/** Folders never searched for notes. */
const SKIPPED_DIRS = new Set(['node_modules', '.git', '.hg', '.svn', 'dist', 'out']);

/** Markdown files under `dir`, depth first, in name order. */
async function markdownFiles(dir: string, out: string[], token: CancellationToken): Promise<void> {
  if (token.isCancellationRequested) return;
  let entries;
  try {
    entries = await readdir(dir, { withFileTypes: true });
  } catch {
    return;
  }
  entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  for (const e of entries) {
    if (e.isDirectory()) {
      if (!SKIPPED_DIRS.has(e.name) && !e.name.startsWith('.')) await markdownFiles(join(dir, e.name), out, token);
    } else if (e.isFile() && /\.(md|markdown)$/i.test(e.name)) {
      out.push(join(dir, e.name));
    }
  }
}

/** Registers the check-all request. */
export function registerCheckWorkspace(ctx: ServerContext, diagnostics: Diagnostics): void {
  ctx.connection.onRequest(CHECK_WORKSPACE_METHOD, (params: CheckWorkspaceParams | undefined, token: CancellationToken) =>
    runSafe(ctx.connection, CHECK_WORKSPACE_METHOD, token, async (): Promise<CheckWorkspaceResult> => {
      let progress: WorkDoneProgressReporter;
      if (params?.workDoneToken !== undefined) progress = ctx.connection.window.attachWorkDoneProgress(params.workDoneToken);
      else if (ctx.client.workDoneProgress) progress = await ctx.connection.window.createWorkDoneProgress();
      else progress = ctx.connection.window.attachWorkDoneProgress(undefined);
      progress.begin('Dewmark: checking notes', 0, 'finding Markdown files', false);
      try {
        const files: string[] = [];
        for (const folder of ctx.folders) {
          if (!folder.startsWith('file:')) continue;
          await markdownFiles(fileURLToPath(folder), files, token);
        }
        const result: CheckWorkspaceResult = { notes: [], filesRead: 0, errors: 0, warnings: 0, unreadable: [] };
        for (let i = 0; i < files.length; i++) {
          if (token.isCancellationRequested) throw cancelled();
          const path = files[i]!;
          const uri = pathToFileURL(path).href;
          progress.report(Math.round((100 * i) / files.length), `${i + 1}/${files.length} ${path.slice(-60)}`);
          const open = await ctx.notes.get(uri);
          let doc: TextDocument;
          let note;
          if (open) {
            ({ doc, note } = open);
          } else {
            let text: string;
            try {
              text = await readFile(path, 'utf8');
            } catch (err) {
              result.unreadable.push({ uri, reason: err instanceof Error ? err.message : String(err) });
              continue;
            }
            doc = TextDocument.create(uri, 'markdown', 0, text);
            note = analyzeText(text, await ctx.config.get(uri));
          }
          result.filesRead++;
          if (note.analysis.parsed.statements.length === 0) continue;
          const checked: CheckedNote = { uri, ...countDiagnostics(note), statements: note.analysis.parsed.statements.length };
          result.notes.push(checked);
          result.errors += checked.errors;
          result.warnings += checked.warnings;
          if (!open) {
            await ctx.connection.sendDiagnostics({ uri, diagnostics: toLspDiagnostics(ctx, doc, note) });
            diagnostics.pushedForClosed(uri);
          }
        }
        return result;
      } finally {
        progress.done();
      }
    }),
  );
}
