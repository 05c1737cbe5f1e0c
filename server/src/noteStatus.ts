/** The custom `dewmark/noteStatus` request: a note's unit system and pressure basis for a status bar. */
import { noteStatus } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toRange } from './convert';
import { NOTE_STATUS_METHOD, type NoteStatusParams, type NoteStatusResult } from '@dewmark/protocol';
import { noteForRequest, runSafe } from './safe';
import type { CancellationToken } from 'vscode-languageserver/node';

/** Registers the note-status request. */
export function registerNoteStatus(ctx: ServerContext): void {
  ctx.connection.onRequest(NOTE_STATUS_METHOD, (params: NoteStatusParams, token: CancellationToken) =>
    runSafe(ctx.connection, NOTE_STATUS_METHOD, token, async (): Promise<NoteStatusResult | null> => {
      const found = await noteForRequest(ctx, params.textDocument.uri, token);
      if (!found) return null;
      const s = noteStatus(found.note);
      const result: NoteStatusResult = {
        units: s.units,
        unitsSource: s.unitsSource,
        unitsValueRange: s.unitsSpan ? toRange(found.doc, s.unitsSpan) : null,
        pressureLabel: s.pressureLabel,
        pressureDescribe: s.pressureDescribe,
      };
      if (s.unitsFile) result.unitsFile = s.unitsFile;
      return result;
    }),
  );
}
