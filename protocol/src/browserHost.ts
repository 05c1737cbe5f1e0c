/**
 * What the web build's language server (a Web Worker, no file system) asks of its client: the
 * texts of files near an open note, read through the editor's own file system (`workspace.fs`),
 * which in the browser is the only one there is. Only the project files `dewmark.json` above an
 * open note are asked for; nothing is written.
 */

/** Server → client request: the texts of the files at `uris` (UTF-8), null for each one that is not there. */
export const READ_FILES_METHOD = 'dewmark/readFiles';

/** Parameters of {@link READ_FILES_METHOD}. */
export interface ReadFilesParams {
  uris: string[];
}

/** Result of {@link READ_FILES_METHOD}: one entry per uri asked for, in the same order. */
export interface ReadFilesResult {
  texts: (string | null)[];
}

/** The most uris one {@link READ_FILES_METHOD} request names (the folders from a note up to its workspace folder). */
export const READ_FILES_MAX = 64;
