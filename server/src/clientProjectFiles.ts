/**
 * Project files for the web build, read by the client: the server in a Web Worker has no file
 * system, so it asks its client (`dewmark/readFiles`, @dewmark/protocol) for `dewmark.json` in the
 * note's folder and each parent up to the workspace folder that holds the note — one request per
 * note for the folders not asked about yet, each answer kept until the next change. Notes outside
 * every workspace folder (untitled ones, or files opened alone) have no project file here; nothing
 * above a workspace folder is read. A project file's `include`/`exclude` patterns are not applied
 * here (deciding them is `@dewmark/files`', which needs Node): every open note is checked.
 */
import {
  PROJECT_FILE,
  findProjectConfig,
  projectSources,
  type ProjectConfig,
  type ServiceSettings,
} from '@dewmark/core/service';
import { READ_FILES_MAX, READ_FILES_METHOD, type ReadFilesParams, type ReadFilesResult } from '@dewmark/protocol';
import type { Connection } from 'vscode-languageserver/node';
import type { ProjectFiles } from './projectFiles';

/** `uri` without a trailing slash. */
const trimSlash = (uri: string): string => (uri.endsWith('/') ? uri.slice(0, -1) : uri);

/**
 * The folders to look in for the note `uri`: its own, then each parent up to the workspace folder
 * that holds it (the innermost, when folders nest), at most {@link READ_FILES_MAX}; empty when no
 * workspace folder holds it.
 */
export function projectFolders(uri: string, folders: readonly string[]): string[] {
  const root = folderOf(uri, folders);
  if (root === undefined) return [];
  const out: string[] = [];
  let dir = uri.slice(0, uri.lastIndexOf('/'));
  while (out.length < READ_FILES_MAX && dir.length >= root.length) {
    out.push(dir);
    if (dir === root) break;
    dir = dir.slice(0, dir.lastIndexOf('/'));
  }
  return out;
}

/** The innermost workspace folder holding `uri`, without a trailing slash, or undefined. */
function folderOf(uri: string, folders: readonly string[]): string | undefined {
  let root: string | undefined;
  for (const f of folders) {
    const folder = trimSlash(f);
    if (uri.startsWith(`${folder}/`) && (root === undefined || folder.length > root.length)) root = folder;
  }
  return root;
}

/** Project files read through the client's file system. */
export class ClientProjectFiles implements ProjectFiles {
  /** Project file uri → its text (null: none there), as asked for since the last change. */
  private readonly texts = new Map<string, Promise<string | null>>();

  constructor(
    private readonly connection: Connection,
    private readonly folders: () => readonly string[],
  ) {}

  async find(uri: string): Promise<ProjectConfig | null> {
    const dirs = projectFolders(uri, this.folders());
    if (dirs.length === 0) return null;
    const files = dirs.map((d) => `${d}/${PROJECT_FILE}`);
    const ask = files.filter((f) => !this.texts.has(f));
    if (ask.length > 0) {
      const params: ReadFilesParams = { uris: ask };
      const answer = this.connection.sendRequest<ReadFilesResult>(READ_FILES_METHOD, params).then(
        (r) => (Array.isArray(r?.texts) ? r.texts : []),
        (err: unknown) => {
          this.connection.console.warn(`the client could not read ${PROJECT_FILE} files: ${String(err)}`);
          return [] as (string | null)[];
        },
      );
      ask.forEach((f, i) => {
        this.texts.set(
          f,
          answer.then((texts) => (typeof texts[i] === 'string' ? texts[i] : null)),
        );
      });
    }
    const read = new Map<string, string | null>();
    await Promise.all(files.map(async (f) => read.set(f, (await this.texts.get(f)) ?? null)));
    const parent = new Map(dirs.map((d, i) => [d, dirs[i + 1] ?? d]));
    return findProjectConfig(dirs[0]!, {
      read: (path) => read.get(path) ?? null,
      parent: (d) => parent.get(d) ?? d,
      join: (d, name) => `${d}/${name}`,
    });
  }

  /** Where the file's values came from, named relative to its workspace folder (`calcs/dewmark.json`). */
  scope(project: ProjectConfig, _uri: string, folders: readonly string[]): Pick<ServiceSettings, 'sources'> {
    const root = folderOf(project.path, folders);
    const sources = projectSources(project, root === undefined ? project.path : project.path.slice(root.length + 1));
    return sources ? { sources } : {};
  }

  clear(): void {
    this.texts.clear();
  }
}
