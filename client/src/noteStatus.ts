/**
 * What the status bar shows for the active note: its unit system and pressure basis. The server
 * answers the `dewmark/noteStatus` request (@dewmark/protocol) and lists it under
 * `capabilities.experimental.dewmark.noteStatus`; a server without it (an older build, or one
 * that failed to start) leaves the client to say what the settings alone imply, and to say that
 * the note's own `units:`/`site:` lines were not read. Pure: no editor API.
 */

import type { NoteStatusResult } from '@dewmark/protocol';

export type { NoteStatusParams, NoteStatusResult } from '@dewmark/protocol';

/** The slice of `dewmark.*` settings the fallback status reads. */
export interface StatusSettings {
  units: unknown;
  pressure: unknown;
  elevation: unknown;
}

/** What the status-bar item displays. */
export interface StatusView {
  text: string;
  tooltip: string;
  /** The unit system a click switches to. */
  other: 'SI' | 'IP';
}

/** The method name when the server's initialize result advertises the note-status request. */
export function advertisedNoteStatus(experimental: unknown): string | null {
  if (!experimental || typeof experimental !== 'object') return null;
  const dewmark = (experimental as Record<string, unknown>).dewmark;
  if (!dewmark || typeof dewmark !== 'object') return null;
  const method = (dewmark as Record<string, unknown>).noteStatus;
  return typeof method === 'string' && method !== '' ? method : null;
}

/** The status implied by the settings alone (used when the server cannot say more). */
export function statusFromSettings(s: StatusSettings): NoteStatusResult {
  const units = s.units === 'IP' ? 'IP' : 'SI';
  const text = (v: unknown): string => (typeof v === 'number' ? String(v) : typeof v === 'string' ? v.trim() : '');
  const elevation = text(s.elevation);
  const pressure = text(s.pressure);
  let pressureLabel = '101.325 kPa';
  const forNotes = 'for notes without a site: line.';
  let pressureDescribe = `Default pressure 101.325 kPa (standard sea level), ${forNotes}`;
  if (elevation !== '') {
    pressureLabel = `elev ${elevation}`;
    pressureDescribe = `Setting dewmark.elevation = ${elevation} (standard atmosphere), ${forNotes}`;
  } else if (pressure !== '') {
    pressureLabel = pressure;
    pressureDescribe = `Setting dewmark.pressure = ${pressure}, ${forNotes}`;
  }
  return { units, unitsSource: 'setting', unitsValueRange: null, pressureLabel, pressureDescribe };
}

/** The status-bar text and tooltip for a note status. */
export function statusView(status: NoteStatusResult, fromServer: boolean): StatusView {
  const other = status.units === 'SI' ? 'IP' : 'SI';
  const unitsWhy =
    status.unitsSource === 'note'
      ? "set by the note's units: line"
      : status.unitsFile
        ? `set by ${status.unitsFile}`
        : 'from the setting dewmark.units';
  const lines = [
    `Dewmark: results in ${status.units} (${unitsWhy}).`,
    status.pressureDescribe,
    status.unitsSource === 'note'
      ? `Click to switch to ${other} (rewrites the note's units: line).`
      : status.unitsFile
        ? `To switch to ${other}, change "units" in ${status.unitsFile} (it wins over the setting dewmark.units).`
        : `Click to switch to ${other} (changes the setting dewmark.units).`,
  ];
  if (!fromServer)
    lines.push(
      "The server did not report this note's own units: or site: lines; these figures come from the settings.",
    );
  return { text: `$(symbol-ruler) ${status.units} · ${status.pressureLabel}`, tooltip: lines.join('\n'), other };
}
