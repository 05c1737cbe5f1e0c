/**
 * A note that its project file leaves out (`include`/`exclude` in `dewmark.json`): `dewmark check`
 * does not check it, so the editor shows none of its problems either — only one info diagnostic
 * (code `note-excluded`) that says which file and which pattern leave it out and what to do.
 * Hovers, hints and the other features still work on it: the note is evaluated as usual.
 */
import type { CoreDiagnostic } from '../notation/ast';
import type { Note } from './types';

/** The info diagnostic of a note left out by its project file, on the start of its first line. */
export function excludedDiagnostic(note: Note): CoreDiagnostic {
  const by = note.settings.excludedBy!;
  const nl = note.text.search(/[\r\n]/);
  const end = Math.min(nl < 0 ? note.text.length : nl, 120);
  return {
    code: 'note-excluded',
    severity: 'info',
    message:
      `This note is left out by ${by.file}: ${by.why}. \`dewmark check\` and Check All do not check it, so its ` +
      'problems are not shown here either (hovers and hints ' +
      'still work). To check it, change the pattern in that file ' +
      'or move the note.',
    span: { start: 0, end },
  };
}
