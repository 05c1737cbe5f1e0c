/** The `dewmark.*` settings the core reads, read from VS Code for one document. */
import * as vscode from 'vscode';
import { SETTINGS_SECTION } from '@dewmark/protocol';

/** The `dewmark.*` keys the core reads, as one plain object for `readSettings`. */
const SETTING_KEYS = [
  'units',
  'pressure',
  'elevation',
  'inlayHints.properties',
  'precision',
  'checkClaims',
  'hover.secondaryUnits',
  'maxNoteSizeKB',
];

/**
 * The settings section for a document (or the window's when
 * there is none), as the plain object the server would receive.
 */
export function rawSettingsFor(uri: vscode.Uri | undefined): Record<string, unknown> {
  const cfg = vscode.workspace.getConfiguration(SETTINGS_SECTION, uri);
  const out: Record<string, unknown> = {};
  for (const key of SETTING_KEYS) out[key] = cfg.get(key);
  return out;
}
