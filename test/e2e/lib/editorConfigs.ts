/**
 * The editor configurations the README gives, read from the README itself: each is the fenced
 * block right after a `<!-- editor-config: NAME -->` marker. The editor tests load exactly that
 * text (written to a file of their run), so the documented configuration is the tested one.
 *
 * @example
 *   const lua = editorConfig('neovim-0.7');            // the block's text
 *   const file = writeEditorConfig('emacs-eglot', dir); // …written to dir/emacs-eglot.el
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { REPO_ROOT } from './tools';

/** The configurations the README holds, with the file ending each language takes. */
export const EDITOR_CONFIGS = {
  'neovim-0.11': 'lua',
  'neovim-lspconfig': 'lua',
  'neovim-0.7': 'lua',
  'emacs-eglot': 'el',
  helix: 'toml',
} as const;

/** A configuration's name (the README marker). */
export type EditorConfigName = keyof typeof EDITOR_CONFIGS;

/** The fenced languages each file ending is written with in the README. */
const FENCE: Record<string, string> = { lua: 'lua', el: 'elisp', toml: 'toml' };

/** The text of the configuration `name` in `readme` (default: the repository's README.md); throws if it is missing. */
export function editorConfig(
  name: EditorConfigName,
  readme = readFileSync(join(REPO_ROOT, 'README.md'), 'utf8'),
): string {
  const marker = `<!-- editor-config: ${name} -->`;
  const at = readme.indexOf(marker);
  if (at < 0) throw new Error(`README.md has no "${marker}"`);
  if (readme.indexOf(marker, at + 1) >= 0) throw new Error(`README.md has "${marker}" twice`);
  const fence = '```' + FENCE[EDITOR_CONFIGS[name]];
  const rest = readme.slice(at + marker.length);
  const m = /^\s*\n(```[a-z]*)\n([\s\S]*?)\n```\n/.exec(rest);
  if (!m) throw new Error(`"${marker}" in README.md is not followed by a fenced block`);
  if (m[1] !== fence) throw new Error(`the block after "${marker}" is fenced ${m[1]}, not ${fence}`);
  return `${m[2]}\n`;
}

/** Writes the configuration `name` into `dir` (as `<name>.<ending>`) and returns the file's path. */
export function writeEditorConfig(name: EditorConfigName, dir: string): string {
  const path = join(dir, `${name}.${EDITOR_CONFIGS[name]}`);
  writeFileSync(path, editorConfig(name));
  return path;
}
