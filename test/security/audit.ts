/** Helpers of the security tests: the I/O audit preload and the records it writes. */
import { readdirSync, readFileSync, readlinkSync, lstatSync } from 'node:fs';
import { join } from 'node:path';

/** Path of the `node --require` preload that records network, file-write and process attempts. */
export const AUDIT_PRELOAD = join(__dirname, 'io-audit.cjs');

/** One attempt recorded by the preload. */
export interface AuditRecord {
  kind: 'file' | 'network' | 'process';
  call: string;
  target: string;
}

/** The `[io-audit]` records in a process's standard error. */
export function auditRecords(stderr: string): AuditRecord[] {
  return stderr
    .split('\n')
    .filter((l) => l.startsWith('[io-audit] '))
    .map((l) => JSON.parse(l.slice('[io-audit] '.length)) as AuditRecord);
}

/**
 * Every entry under `dir` (files with size, mode, mtime and content; links with their target;
 * folders), for a before/after comparison that shows what a process changed.
 */
export function snapshot(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (d: string) => {
    for (const e of readdirSync(d).sort()) {
      const p = join(d, e);
      const st = lstatSync(p);
      if (st.isSymbolicLink()) out[p] = `link ${readlinkSync(p)}`;
      else if (st.isDirectory()) {
        out[`${p}/`] = `dir ${st.mode}`;
        walk(p);
      } else out[p] = `${st.size} ${st.mode} ${st.mtimeMs} ${readFileSync(p, 'base64')}`;
    }
  };
  walk(dir);
  return out;
}
