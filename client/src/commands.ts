/**
 * Command identifiers the extension registers. The manifest's `contributes.commands` lists
 * exactly these (checked by test/client/manifest.test.ts). Pure: no editor API.
 */

/** Every command of the extension, with the palette title it is contributed under. */
export const COMMANDS = {
  switchUnits: { id: 'dewmark.switchUnits', title: 'Switch Result Units (SI/IP)' },
  checkWorkspace: { id: 'dewmark.checkWorkspace', title: 'Check All Notes in the Workspace' },
  showChart: { id: 'dewmark.showChart', title: 'Show Psychrometric Chart' },
  toggleChartCases: {
    id: 'dewmark.toggleChartCases',
    title: 'Chart: Show All States / Follow the Section at the Cursor',
  },
  insertResultsTable: { id: 'dewmark.insertResultsTable', title: 'Insert or Refresh Results Table' },
  restartServer: { id: 'dewmark.restartServer', title: 'Restart Language Server' },
  showLog: { id: 'dewmark.showLog', title: 'Show Server Log' },
} as const;

/** The category every command appears under in the Command Palette. */
export const COMMAND_CATEGORY = 'Dewmark';

/** Name of the output channel that holds the server log (Output → Dewmark). */
export const OUTPUT_CHANNEL = 'Dewmark';

/**
 * Context key set when the running server has no workspace
 * check (the manifest's palette `when` for Check All reads it).
 */
export const NO_WORKSPACE_CHECK_CONTEXT = 'dewmark.noWorkspaceCheck';
