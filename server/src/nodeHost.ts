/**
 * What the Node server does with the file system: project files `dewmark.json` read from the disk
 * above a local note (`file:` URIs; other schemes have none), with their include/exclude decided
 * by `@dewmark/files` (./projectScope), and the workspace check (./checkWorkspace). The web build has neither (./browserMain), so nothing here may be imported
 * by the code the two builds share.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { findProjectConfig, type ConfigFileSystem } from '@dewmark/core/service';
import { registerCheckWorkspace } from './checkWorkspace';
import type { ProjectFiles } from './projectFiles';
import { projectScope } from './projectScope';
import type { ServerHost } from './server';

/** Project files on this machine's disk, each read once until the next change. */
export function nodeProjectFiles(): ProjectFiles {
  /** Project file texts read since the last change (null: none there), so each is read once. */
  const texts = new Map<string, string | null>();
  const fs: ConfigFileSystem = {
    read: (path) => {
      if (!texts.has(path)) {
        let text: string | null = null;
        try {
          text = readFileSync(path, 'utf8');
        } catch {
          text = null;
        }
        texts.set(path, text);
      }
      return texts.get(path)!;
    },
    parent: (d) => dirname(d),
    join: (d, name) => join(d, name),
  };
  return {
    find(uri) {
      if (!uri.startsWith('file:')) return null;
      let dir: string;
      try {
        dir = dirname(fileURLToPath(uri));
      } catch {
        return null; // a file URI of another host
      }
      return findProjectConfig(dir, fs);
    },
    scope: projectScope,
    clear: () => texts.clear(),
  };
}

/** The Node server's host: the disk for project files, and Check All. */
export function nodeHost(): ServerHost {
  return { projectFiles: nodeProjectFiles(), registerCheckWorkspace };
}
