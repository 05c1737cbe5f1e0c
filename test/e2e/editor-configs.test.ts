/**
 * What can be checked of the README's editor configurations without the editor: each block is
 * there, under its marker, and starts the package's own server command with `--stdio`; the Helix
 * `languages.toml` (untested in Helix, which cannot be installed here) is valid TOML whose
 * language server is that command, whose `config` the server reads without a problem and answers
 * with (Helix sends it as `initializationOptions`), and which keeps Markdown's other server.
 * The editors that can be installed run their blocks in neovim.test.ts, neovim-configs.test.ts and
 * emacs.test.ts.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'smol-toml';
import { describe, expect, it } from 'vitest';
import { readSettings } from '@dewmark/core/service';
import { startServer } from '../protocol/harness';
import { EDITOR_CONFIGS, type EditorConfigName, editorConfig } from './lib/editorConfigs';
import { REPO_ROOT } from './lib/tools';

const bins = Object.keys((JSON.parse(readFileSync(join(REPO_ROOT, 'package.json'), 'utf8')) as { bin: object }).bin);

describe('the README editor configurations', () => {
  it.each(Object.keys(EDITOR_CONFIGS) as EditorConfigName[])('%s starts dewmark-language-server --stdio', (name) => {
    expect(bins).toContain('dewmark-language-server');
    const text = editorConfig(name);
    expect(text).toMatch(/["']dewmark-language-server["']/);
    expect(text).toMatch(/["']--stdio["']/);
  });

  it('the marker finds only a fenced block of the right language (so a broken README fails)', () => {
    expect(() => editorConfig('helix', 'text\n<!-- editor-config: helix -->\n\n```lua\nx\n```\n')).toThrow(
      'fenced ```lua, not ```toml',
    );
    expect(() => editorConfig('helix', 'no marker')).toThrow('README.md has no "<!-- editor-config: helix -->"');
    expect(editorConfig('helix', '<!-- editor-config: helix -->\n```toml\na = 1\n```\n')).toBe('a = 1\n');
  });
});

describe('the Helix languages.toml (untested in Helix)', () => {
  const toml = parse(editorConfig('helix')) as {
    'language-server': Record<string, { command: string; args: string[]; config: Record<string, unknown> }>;
    language: { name: string; 'language-servers': string[] }[];
  };
  const server = toml['language-server'].dewmark!;

  it('runs the package command with --stdio for Markdown, beside Markdown’s usual server', () => {
    expect(server.command).toBe('dewmark-language-server');
    expect(server.args).toEqual(['--stdio']);
    expect(toml.language).toEqual([{ name: 'markdown', 'language-servers': ['marksman', 'dewmark'] }]);
  });

  it('its settings are read without a problem, by the core and by the server at initialize', async () => {
    expect(Object.keys(server.config)).toEqual(['dewmark']);
    expect(readSettings(server.config.dewmark).problems).toEqual([]);
    const s = startServer();
    try {
      const init = await s.initialize({}, { initializationOptions: server.config });
      expect((init as { serverInfo?: { name: string } }).serverInfo?.name).toBe('dewmark-language-server');
      expect(s.logs.filter((l) => /settings/i.test(l))).toEqual([]);
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });
});
