/** The Markdown notes of the repository that the output comparisons run over. */
import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

/** The repository's root. */
export const repo = join(__dirname, '..', '..', '..');

/** Every Markdown note below `dir` (recursively). */
export function notesBelow(dir: string): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir)) {
    if (e === 'node_modules' || e.startsWith('.')) continue;
    const p = join(dir, e);
    if (statSync(p).isDirectory()) out.push(...notesBelow(p));
    else if (/\.(md|markdown)$/.test(e)) out.push(p);
  }
  return out;
}

/** Every note of the test fixtures, the examples and the docs. */
export function repositoryNotes(): string[] {
  return [
    ...notesBelow(join(repo, 'test', 'fixtures')),
    ...notesBelow(join(repo, 'examples')),
    ...notesBelow(join(repo, 'docs')),
  ];
}
