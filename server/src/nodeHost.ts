/**
 * What the Node server does with the file system: project files `dewmark.json` read from the disk
 * above a local note (`file:` URIs; other schemes have none), with their include/exclude decided
 * by `@dewmark/files` (./projectScope), and the workspace check (./checkWorkspace). The web build has neither
 * (./browserMain), so nothing here may be imported by the code the two builds share.
 */
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { findProjectConfig } from '@dewmark/core/service';
import { cachedDiskFiles } from '@dewmark/files';
import { registerCheckWorkspace } from './checkWorkspace';
import type { ProjectFiles } from './projectFiles';
import { projectScope } from './projectScope';
import type { ServerHost } from './server';

/** Project files on this machine's disk, each read once until the next change. */
export function nodeProjectFiles(): ProjectFiles {
  /** Project file texts read since the last change, so each is read once. */
  const fs = cachedDiskFiles();
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
    clear: () => fs.clear(),
  };
}

/** The Node server's host: the disk for project files, and Check All. */
export function nodeHost(): ServerHost {
  return { projectFiles: nodeProjectFiles(), registerCheckWorkspace };
}
