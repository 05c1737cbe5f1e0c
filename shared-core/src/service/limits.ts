/**
 * The size limit of the editor features: a note longer than the `maxNoteSizeKB` setting (2 MB by
 * default) is not parsed or evaluated as the engineer types — evaluating several MB after every
 * keystroke would keep the language server busy for seconds. Such a note gets one info
 * diagnostic (code `note-too-large`) that says so, how large it is and what to do; every other
 * feature finds nothing in it. The command line has no limit (`dewmark check` evaluates any note).
 */
import { analyzeNote } from '../analyze';
import type { CoreDiagnostic } from '../notation/ast';
import { toEvaluateSettings } from './settings';
import type { Note, ServiceSettings } from './types';

/** Diagnostic code of a note too large to evaluate in the editor. */
export const NOTE_TOO_LARGE = 'note-too-large';

/** The limit in characters (UTF-16 units, as editors count), or Infinity for none. */
export function limitChars(settings: ServiceSettings): number {
  return settings.maxNoteKB > 0 ? settings.maxNoteKB * 1024 : Number.POSITIVE_INFINITY;
}

/** True when `text` is longer than the limit of `settings`. */
export function overLimit(text: string, settings: ServiceSettings): boolean {
  return text.length > limitChars(settings);
}

/** A note too large to evaluate: its text, an empty analysis, and what the limit was. */
export function limitedNote(text: string, settings: ServiceSettings): Note {
  return {
    text,
    analysis: analyzeNote('', toEvaluateSettings(settings)),
    settings,
    limited: { chars: text.length, limitChars: limitChars(settings) },
  };
}

function size(chars: number): string {
  return chars >= 1024 * 1024 ? `${(chars / 1024 / 1024).toFixed(1)} MB` : `${Math.round(chars / 1024)} KB`;
}

/** The info diagnostic of a limited note, on the start of its first line. */
export function limitDiagnostic(note: Note): CoreDiagnostic {
  const limited = note.limited!;
  const nl = note.text.search(/[\r\n]/);
  const end = Math.min(nl < 0 ? note.text.length : nl, 120);
  return {
    code: NOTE_TOO_LARGE,
    severity: 'info',
    message:
      `This note is ${size(limited.chars)}, more than ` +
      `the ${size(limited.limitChars)} that Dewmark evaluates as you type ` +
      `(setting dewmark.maxNoteSizeKB = ${note.settings.maxNoteKB}): no figures, hints or problems are shown for it. ` +
      'Check it with `dewmark check` on the command line, split ' +
      'it into smaller notes, or raise the setting (0 = no limit).',
    span: { start: 0, end },
  };
}
