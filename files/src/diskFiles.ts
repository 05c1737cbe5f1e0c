/**
 * Project files read from this machine's disk, each path read once until `clear()`: one reader for
 * the command line and the Node language server. Its shape is the core's `ConfigFileSystem`
 * (this package does not import the core).
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';

/** Reads files from the disk once each (null: none there, or unreadable) and walks folders with Node's path. */
export interface CachedDiskFiles {
  /** The file's text, or null when there is none (or it cannot be read). */
  read(path: string): string | null;
  /** The parent folder, or the same folder at the root. */
  parent(dir: string): string;
  join(dir: string, name: string): string;
  /** Forgets every text read so far (the next read goes to the disk again). */
  clear(): void;
}

/** A fresh reader with an empty cache. */
export function cachedDiskFiles(): CachedDiskFiles {
  const texts = new Map<string, string | null>();
  return {
    read(path) {
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
    parent: (dir) => dirname(dir),
    join: (dir, name) => join(dir, name),
    clear: () => texts.clear(),
  };
}
