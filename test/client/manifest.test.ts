/**
 * The extension manifest (root package.json) agrees with the code: the commands contributed are
 * exactly the ones the client registers, every setting is one the server reads (its default gives
 * the server's defaults, and a changed value changes what the server uses), and every file the
 * manifest names is packed by client/vsix.vscodeignore.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { COMMAND_CATEGORY, COMMANDS, NO_WORKSPACE_CHECK_CONTEXT } from '../../client/src/commands';
import { DEFAULT_SERVICE_SETTINGS, readSettings, RULE_VALUES } from '../../shared-core/src/service/settings';
import { HINT_KEYS } from '../../shared-core/src/service/types';
import { keySpec } from '../../shared-core/src/vocabulary/keys';
import { PROJECT_KEYS, SETTING_KEYS } from '../../shared-core/src/service/projectConfig';
// @ts-expect-error -- a plain ES module without type declarations
import { fields, scripts } from '../../client/manifest.mjs';

const root = join(__dirname, '..', '..');
const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as Record<string, any>;

interface SettingSchema {
  type: string;
  default: unknown;
  enum?: string[];
  items?: { enum?: string[]; enumDescriptions?: string[] };
  markdownDescription?: string;
  description?: string;
  minimum?: number;
  maximum?: number;
}
const properties = manifest.contributes.configuration.properties as Record<string, SettingSchema>;

/** A valid value different from the default, to prove the server reads the setting. */
const changed: Record<string, unknown> = {
  'dewmark.units': 'IP',
  'dewmark.pressure': '84 kPa',
  'dewmark.elevation': '1600 m',
  'dewmark.inlayHints.properties': ['wb', 'v'],
  'dewmark.precision': 2,
  'dewmark.checkClaims': false,
  'dewmark.hover.secondaryUnits': true,
  'dewmark.maxNoteSizeKB': 512,
};

/** Nests `{ 'a.b': v }` the way VS Code hands a section to `workspace/configuration`. */
function section(values: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, any> = {};
  for (const [key, v] of Object.entries(values)) {
    const parts = key.replace(/^dewmark\./, '').split('.');
    let cur = out;
    for (const p of parts.slice(0, -1)) cur = cur[p] ??= {};
    cur[parts[parts.length - 1]!] = v;
  }
  return out;
}

describe('extension manifest', () => {
  it('package.json holds the fields of client/manifest.mjs', () => {
    for (const [k, v] of Object.entries(fields as Record<string, unknown>)) expect(manifest[k], k).toEqual(v);
    for (const [k, v] of Object.entries(scripts as Record<string, string>)) expect(manifest.scripts[k], k).toBe(v);
  });

  it('activates on Markdown and runs the bundled client', () => {
    expect(manifest.main).toBe('./dist/client.js');
    expect(manifest.activationEvents).toContain('onLanguage:markdown');
    expect(manifest.engines.vscode).toBe('^1.91.0');
    // dist/client.js is a CommonJS bundle: VS Code requires it, which fails in a "type": "module" package.
    expect(manifest.type ?? 'commonjs', 'the root package must stay CommonJS').toBe('commonjs');
    expect(manifest.capabilities.untrustedWorkspaces).toEqual({ supported: true });
    // Virtual workspaces: open notes get everything, but Check All reads local folders only.
    expect(manifest.capabilities.virtualWorkspaces.supported).toBe('limited');
    expect(manifest.capabilities.virtualWorkspaces.description).toMatch(/Check All/);
    // The web build: the browser-only editor runs dist/web/client.js (built from client/src/web.ts);
    // the palette hides Check All where the server cannot search (the context key the client sets).
    expect(manifest.browser).toBe('./dist/web/client.js');
    expect(manifest.extensionKind).toEqual(['workspace']);
    const checkAll = (manifest.contributes.menus.commandPalette as { command: string; when?: string }[]).find(
      (m) => m.command === COMMANDS.checkWorkspace.id,
    );
    expect(checkAll?.when).toContain(`!${NO_WORKSPACE_CHECK_CONTEXT}`);
  });

  it('names where the project lives, and is publishable to npm', () => {
    expect(manifest.private, 'the root package is the npm package "dewmark"').toBeUndefined();
    expect(manifest.repository.url).toMatch(/^git\+https:\/\//);
    expect(manifest.homepage).toMatch(/^https:\/\//);
    expect(manifest.bugs.url).toMatch(/^https:\/\//);
    // vsce refuses a root .vscodeignore beside the npm `files` list; the .vsix list lives in client/.
    expect(existsSync(join(root, '.vscodeignore'))).toBe(false);
    expect(manifest.files).not.toContain('dist/client.js');
  });

  it('contributes exactly the commands the client registers, under the Dewmark category', () => {
    const contributed = (manifest.contributes.commands as { command: string; title: string; category: string }[]).map(
      (c) => [c.command, c.title, c.category],
    );
    const code = Object.values(COMMANDS).map((c) => [c.id, c.title, COMMAND_CATEGORY]);
    expect(contributed.sort()).toEqual(code.sort());
    const source = readFileSync(join(root, 'client', 'src', 'extension.ts'), 'utf8');
    for (const key of Object.keys(COMMANDS))
      expect(source, key).toMatch(new RegExp(`registerCommand\\(\\s*COMMANDS\\.${key}\\.id`));
    const palette = (manifest.contributes.menus.commandPalette as { command: string }[]).map((m) => m.command).sort();
    expect(palette).toEqual(
      Object.values(COMMANDS)
        .map((c) => c.id)
        .sort(),
    );
  });

  it('every setting has a description and a default, and the defaults are the server defaults', () => {
    for (const [key, s] of Object.entries(properties)) {
      expect(s.markdownDescription ?? s.description, key).toBeTruthy();
      expect(s.default, key).not.toBeUndefined();
    }
    const defaults = Object.fromEntries(Object.entries(properties).map(([k, s]) => [k, s.default]));
    const { settings, problems } = readSettings(section(defaults));
    expect(problems).toEqual([]);
    expect(settings).toEqual(DEFAULT_SERVICE_SETTINGS);
  });

  it('every setting except the client-side trace is read by the server', () => {
    const serverSide = Object.keys(properties).filter((k) => k !== 'dewmark.trace.server');
    expect(serverSide.sort()).toEqual(Object.keys(changed).sort());
    const base = readSettings(section({})).settings;
    for (const key of serverSide) {
      const { settings, problems } = readSettings(section({ [key]: changed[key] }));
      expect(problems, key).toEqual([]);
      expect(settings, `${key} = ${JSON.stringify(changed[key])} changes nothing the server uses`).not.toEqual(base);
    }
    expect(properties['dewmark.trace.server']!.enum).toEqual(['off', 'messages', 'verbose']);
  });

  it('enumerates the hint keys and unit systems the server accepts', () => {
    expect(properties['dewmark.inlayHints.properties']!.items!.enum).toEqual([...HINT_KEYS]);
    // The descriptions are the key table's too (client/manifest.mjs cannot import TypeScript, so it
    // keeps a copy that this test holds to the table).
    expect(properties['dewmark.inlayHints.properties']!.items!.enumDescriptions).toEqual(
      HINT_KEYS.map((k) => keySpec(k).hint),
    );
    expect(properties['dewmark.units']!.enum).toEqual(['SI', 'IP']);
    const { problems } = readSettings(section({ 'dewmark.precision': properties['dewmark.precision']!.maximum! + 1 }));
    expect(problems.length, 'the manifest maximum of dewmark.precision is the server maximum').toBe(1);
  });

  it('packs every file the manifest names, and nothing from node_modules', () => {
    const ignore = readFileSync(join(root, 'client', 'vsix.vscodeignore'), 'utf8')
      .split('\n')
      .map((l) => l.trim());
    expect(ignore).toContain('**');
    const named = [
      manifest.main.replace(/^\.\//, ''),
      'dist/server.js',
      manifest.browser.replace(/^\.\//, ''),
      'dist/web/server.js',
      manifest.icon,
      ...(manifest.contributes.grammars as { path: string }[]).map((g) => g.path.replace(/^\.\//, '')),
      ...(manifest.contributes.languages as { configuration: string }[]).map((l) =>
        l.configuration.replace(/^\.\//, ''),
      ),
      ...(manifest.contributes['markdown.previewStyles'] as string[]).map((p) => p.replace(/^\.\//, '')),
      'LICENSE',
      'CHANGELOG.md',
      ...(manifest.contributes.jsonValidation as { url: string }[]).map((v) => v.url.replace(/^\.\//, '')),
    ];
    for (const f of named) {
      expect(ignore, f).toContain(`!${f}`);
      if (!f.startsWith('dist/')) expect(existsSync(join(root, f)), f).toBe(true);
    }
    expect(ignore.filter((l) => l.startsWith('!') && l.includes('node_modules'))).toEqual([]);
  });

  it(
    'validates dewmark.json with a schema whose keys and ' +
      'values are the ones the project file and the server accept',
    () => {
      expect(manifest.contributes.jsonValidation).toEqual([
        { fileMatch: 'dewmark.json', url: './schema/dewmark.schema.json' },
      ]);
      expect(manifest.files).toContain('schema/');
      const schema = JSON.parse(readFileSync(join(root, 'schema', 'dewmark.schema.json'), 'utf8')) as Record<
        string,
        any
      >;
      expect(schema.additionalProperties).toBe(false);
      expect(Object.keys(schema.properties).sort()).toEqual([...PROJECT_KEYS].sort());
      expect(schema.properties.units.enum).toEqual(properties['dewmark.units']!.enum);
      expect(schema.properties.inlayHints.properties.properties.items.enum).toEqual([...HINT_KEYS]);
      expect(schema.properties.precision.maximum).toBe(properties['dewmark.precision']!.maximum);
      expect(schema.properties.rules.additionalProperties.enum).toEqual([...RULE_VALUES]);
      // Every editor-setting key of the project file is a contributed setting.
      for (const key of SETTING_KEYS)
        expect(
          Object.keys(properties).some((k) => k === `dewmark.${key}` || k.startsWith(`dewmark.${key}.`)),
          key,
        ).toBe(true);
    },
  );
});
