/** The status-bar text of the extension client (client/src/noteStatus.ts). No figures: labels only. */
import { describe, expect, it } from 'vitest';
import { advertisedNoteStatus, statusFromSettings, statusView } from '../../client/src/noteStatus';

describe('note status', () => {
  it('uses the server request only when the server advertises it', () => {
    expect(advertisedNoteStatus(undefined)).toBeNull();
    expect(advertisedNoteStatus({ dewmark: { checkWorkspace: 'dewmark/checkWorkspace' } })).toBeNull();
    expect(advertisedNoteStatus({ dewmark: { noteStatus: 'dewmark/noteStatus' } })).toBe('dewmark/noteStatus');
  });

  it('falls back to the settings: default pressure, a pressure setting, an elevation that wins', () => {
    expect(statusFromSettings({ units: undefined, pressure: '', elevation: '' })).toMatchObject({
      units: 'SI',
      unitsSource: 'setting',
      pressureLabel: '101.325 kPa',
    });
    expect(statusFromSettings({ units: 'IP', pressure: '14.2 psia', elevation: '' })).toMatchObject({
      units: 'IP',
      pressureLabel: '14.2 psia',
    });
    const s = statusFromSettings({ units: 'SI', pressure: '90 kPa', elevation: '1600 m' });
    expect(s.pressureLabel).toBe('elev 1600 m');
    expect(s.pressureDescribe).toContain('dewmark.elevation');
  });

  it('says what a click does and where the figures come from', () => {
    const fromSettings = statusView(statusFromSettings({ units: 'SI', pressure: '', elevation: '' }), false);
    expect(fromSettings.text).toContain('SI · 101.325 kPa');
    expect(fromSettings.other).toBe('IP');
    expect(fromSettings.tooltip).toContain('changes the setting dewmark.units');
    expect(fromSettings.tooltip).toContain('did not report');
    const fromNote = statusView(
      {
        units: 'IP',
        unitsSource: 'note',
        unitsValueRange: { start: { line: 3, character: 7 }, end: { line: 3, character: 9 } },
        pressureLabel: 'site 83.4 kPa',
        pressureDescribe: 'Site line 2: elev=1600m.',
      },
      true,
    );
    expect(fromNote.text).toContain('IP · site 83.4 kPa');
    expect(fromNote.other).toBe('SI');
    expect(fromNote.tooltip).toContain("rewrites the note's units: line");
    expect(fromNote.tooltip).not.toContain('did not report');
  });

  it('names the project file that sets the units, and says to change it there (a click cannot)', () => {
    const fromFile = statusView(
      {
        units: 'IP',
        unitsSource: 'setting',
        unitsFile: 'calcs/dewmark.json',
        unitsValueRange: null,
        pressureLabel: '101.325 kPa',
        pressureDescribe: 'Default.',
      },
      true,
    );
    expect(fromFile.tooltip).toContain('Dewmark: results in IP (set by calcs/dewmark.json).');
    expect(fromFile.tooltip).toContain('change "units" in calcs/dewmark.json');
    expect(fromFile.tooltip).not.toContain('changes the setting dewmark.units');
  });
});
