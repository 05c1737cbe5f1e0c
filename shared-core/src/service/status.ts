/**
 * The note's status for an editor's status bar: the unit system its results are shown in (and
 * whether the note or the settings chose it), and the pressure basis of its first state.
 */
import type { StateResult } from '../evaluate/types';
import type { Span } from '../text/types';
import { show } from './format';
import { toEvaluateSettings } from './settings';
import type { Note } from './types';

/** Unit system and pressure basis of a note, as plain data. */
export interface NoteStatus {
  units: 'SI' | 'IP';
  unitsSource: 'note' | 'setting';
  /** The project file that sets the units (as `ServiceSettings.sources` names it), when no `units:` line does. */
  unitsFile?: string;
  /** The `SI`/`IP` word of the `units:` line that sets the note's units (its first valid one), when it has one. */
  unitsSpan: Span | null;
  /** A short label: "101.325 kPa", "site 83.4 kPa". */
  pressureLabel: string;
  /** One sentence on where the pressure comes from. */
  pressureDescribe: string;
}

/** The status of a note: its units and the pressure its first state (or the settings) use. */
export function noteStatus(note: Note): NoteStatus {
  const a = note.analysis;
  // The evaluator takes the first units: line that names SI or IP; an invalid one before it is skipped.
  const unitsLine = a.parsed.statements.find(
    (s) => s.keyword === 'units' && (s.system?.text === 'SI' || s.system?.text === 'IP'),
  );
  const unitsSpan = unitsLine?.keyword === 'units' && unitsLine.system ? unitsLine.system.span : null;
  const first = a.items.find((i): i is StateResult => i.kind !== 'process');
  let pressureLabel: string;
  let pressureDescribe: string;
  if (first) {
    const p = show(note, first.pressure.pa, 'pressure', a.units);
    pressureLabel =
      first.pressure.source === 'site' ? `site ${p}` : first.pressure.source === 'override' ? `${p} (own)` : p;
    pressureDescribe = `The first state, ${first.name}, is at ${p}: ${first.pressure.origin}.`;
  } else {
    const e = toEvaluateSettings(note.settings);
    pressureLabel = show(note, e.pressurePa, 'pressure', a.units);
    pressureDescribe = `Statements without a site: line use ${pressureLabel} (${e.pressureOrigin}).`;
  }
  const status: NoteStatus = { units: a.units, unitsSource: a.unitsSource, unitsSpan, pressureLabel, pressureDescribe };
  const unitsFile = note.settings.sources?.units;
  if (a.unitsSource === 'setting' && unitsFile) status.unitsFile = unitsFile;
  return status;
}
