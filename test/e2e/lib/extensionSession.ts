/**
 * The set-up the code-server suites share: package the extension as a user's .vsix gets it
 * (client/package-vsix.mjs: build, then vsce with .vscodeignore) into a fresh temporary folder,
 * start code-server with it installed (lib/codeServer.ts) and open a note. `close()` ends the
 * session and removes the folder.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type CodeServerOptions, type CodeServerSession, startSession, type WorkbenchOptions } from './codeServer';
import { REPO_ROOT } from './tools';

/** A code-server session with the packaged extension installed. */
export interface ExtensionSession extends CodeServerSession {
  /** The temporary folder holding the .vsix (removed by `close()`). */
  work: string;
  /** The packaged .vsix. */
  vsix: string;
}

export interface ExtensionSessionOptions {
  /** Prefix of the temporary folder's name, e.g. `dewmark-chain-`. */
  workPrefix: string;
  /** File name of the .vsix in that folder. */
  vsixName: string;
  /** code-server's options (the .vsix is added to `extensions`); a function gets the temporary folder. */
  server: Omit<CodeServerOptions, 'extensions'> | ((work: string) => Omit<CodeServerOptions, 'extensions'>);
  workbench: WorkbenchOptions;
  /** The workspace file to open once the workbench is up. */
  open: string;
}

/** Packages the extension into `work` as `vsixName`; throws with vsce's output when packaging fails. */
export function packageVsix(work: string, vsixName: string): string {
  const vsix = join(work, vsixName);
  // Under `npm test` the bundles were just built; rebuilding here could race other suites that run them.
  const build = process.env.npm_lifecycle_event === 'test' ? ['--no-build'] : [];
  const r = spawnSync(process.execPath, [join(REPO_ROOT, 'client', 'package-vsix.mjs'), ...build, '--out', vsix], {
    cwd: REPO_ROOT,
    encoding: 'utf8',
    timeout: 180_000,
  });
  if (r.status !== 0 || !existsSync(vsix))
    throw new Error(`packaging the .vsix failed (exit ${r.status}):\n${r.stdout}\n${r.stderr}`);
  return vsix;
}

/** Packages the extension, starts code-server with it and opens `open`. */
export async function startExtensionSession(o: ExtensionSessionOptions): Promise<ExtensionSession> {
  const work = mkdtempSync(join(tmpdir(), o.workPrefix));
  const removeWork = () => rmSync(work, { recursive: true, force: true });
  let session: CodeServerSession | undefined;
  try {
    const vsix = packageVsix(work, o.vsixName);
    const server = typeof o.server === 'function' ? o.server(work) : o.server;
    session = await startSession({ ...server, extensions: [vsix] }, o.workbench);
    await session.workbench.openFile(o.open);
    const s = session;
    return {
      ...s,
      work,
      vsix,
      close: async () => {
        try {
          await s.close();
        } finally {
          removeWork();
        }
      },
    };
  } catch (e) {
    await session?.close();
    removeWork();
    throw e;
  }
}
