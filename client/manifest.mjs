#!/usr/bin/env node
/**
 * The extension manifest fields, merged into the root package.json (which is the manifest VS Code
 * reads). Reads the file, sets only the fields below, and writes it back in one go, so fields
 * other people own (dependencies, workspaces, other scripts) are kept as they are.
 *
 *   node client/manifest.mjs          write the fields
 *   node client/manifest.mjs --check  exit 1 (and say which) when the file differs from them
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { isDeepStrictEqual } from 'node:util';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

/**
 * VS Code's default editor.wordWrapBreakAfterCharacters (1.139) less '.', ',', '/' and '°', which
 * occur inside the figures of inline hints.
 */
const WRAP_BREAK_AFTER =
  ' \t})]?|&;' +
  '\u00a2\u2032\u2033\u2030\u2103\u3001\u3002\uff61\uff64\uffe0\uff0c\uff0e\uff1a\uff1b\uff1f\uff01' +
  '\uff05\u30fb\uff65\u309d\u309e\u30fd\u30fe\u30fc\u30a1\u30a3\u30a5\u30a7\u30a9\u30c3\u30e3\u30e5' +
  '\u30e7\u30ee\u30f5\u30f6\u3041\u3043\u3045\u3047\u3049\u3063\u3083\u3085\u3087\u308e\u3095\u3096' +
  '\u31f0\u31f1\u31f2\u31f3\u31f4\u31f5\u31f6\u31f7\u31f8\u31f9\u31fa\u31fb\u31fc\u31fd\u31fe\u31ff' +
  '\u3005\u303b\uff67\uff68\uff69\uff6a\uff6b\uff6c\uff6d\uff6e\uff6f\uff70\u201d\u3009\u300b\u300d' +
  '\u300f\u3011\u3015\uff09\uff3d\uff5d\uff63';
const manifestPath = join(root, 'package.json');

/**
 * Hint keys the server accepts in dewmark.inlayHints.properties, with their descriptions: the rows of
 * the key table (shared-core/src/vocabulary/keys.ts) marked `hint`. A plain script cannot import the
 * TypeScript table, so test/client/manifest.test.ts holds this copy to it (keys, order, wording).
 */
const HINT_KEYS = [
  ['db', 'dry-bulb temperature'],
  ['wb', 'thermodynamic wet-bulb temperature'],
  ['dp', 'dew-point temperature'],
  ['rh', 'relative humidity'],
  ['w', 'humidity ratio'],
  ['h', 'specific enthalpy per mass of dry air'],
  ['v', 'specific volume per mass of dry air'],
  ['rho', 'density of the moist air'],
];

const category = 'Dewmark';

/** The project's own web address (the security contact is a mailbox on the same domain). */
export const HOMEPAGE = 'https://dewmark.dev';

/** Top-level manifest fields this script owns. */
export const fields = {
  homepage: HOMEPAGE,
  repository: { type: 'git', url: 'git+https://github.com/dewmark/dewmark.git' },
  bugs: { url: 'https://github.com/dewmark/dewmark/issues' },
  // The npm package (`npm i dewmark`): the two commands and their bundles. The .vsix is packed by
  // .vscodeignore instead (vsce reads that first), from the same manifest and version.
  files: [
    'bin/',
    'dist/cli.js',
    'dist/server.js',
    'dist/THIRD-PARTY-NOTICES.md',
    'README.md',
    'CHANGELOG.md',
    'SECURITY.md',
    'LICENSE',
    'ci/',
    'action.yml',
    '.pre-commit-hooks.yaml',
    'schema/',
  ],
  main: './dist/client.js',
  // The web build (client/src/web.ts): where there is no Node extension host (the browser-based
  // editor without a remote), the editor runs this, with the language server in a Web Worker.
  browser: './dist/web/client.js',
  icon: 'images/icon.png',
  galleryBanner: { color: '#0b2f45', theme: 'dark' },
  preview: true,
  categories: ['Linters', 'Programming Languages', 'Other'],
  keywords: [
    'psychrometrics',
    'moist air',
    'HVAC',
    'humidity',
    'dew point',
    'enthalpy',
    'markdown',
    'engineering',
    'calculation notes',
  ],
  // Where a Node extension host is beside the workspace (desktop, remote, code-server) the Node
  // build runs there, reading the notes' folders from disk; the browser-only editor adds the
  // web kind itself for an extension with a `browser` entry (the manifest lists only ui/workspace).
  extensionKind: ['workspace'],
  activationEvents: ['onLanguage:markdown'],
  capabilities: {
    untrustedWorkspaces: { supported: true },
    virtualWorkspaces: {
      supported: 'limited',
      description:
        'In a virtual workspace the open notes get hints, hovers, problems, fixes and the ' +
        'chart. Check All Notes in the Workspace reads folders on disk only, and is not ' +
        'offered in the browser-only editor (whose language server runs in a web worker, with ' +
        'no file system). The project file dewmark.json is read beside local notes; in the ' +
        'browser-only editor it is read through the editor for notes inside a workspace folder.',
    },
  },
  contributes: {
    configuration: {
      title: 'Dewmark',
      properties: {
        'dewmark.units': {
          order: 1,
          type: 'string',
          enum: ['SI', 'IP'],
          enumDescriptions: [
            'SI: °C, kPa, kJ/kg (dry air h = 0 at 0 °C)',
            'IP: °F, psia, Btu/lb (dry air h = 0 at 0 °F)',
          ],
          default: 'SI',
          scope: 'resource',
          markdownDescription:
            'Unit system of the results (hovers, inline hints, messages) in notes without a `units:` ' +
            "line. A note's own `units: SI` or `units: IP` line wins. Input may mix units freely.",
        },
        'dewmark.pressure': {
          order: 2,
          type: 'string',
          default: '',
          scope: 'resource',
          markdownDescription:
            'Barometric pressure for notes without a `site:` line, a number with a ' +
            'unit: `101.325 kPa`, `14.696 psia`, `29.92 inHg`. Empty: 101.325 kPa ' +
            '(standard sea level). `#dewmark.elevation#` wins when both are set.',
        },
        'dewmark.elevation': {
          order: 3,
          type: 'string',
          default: '',
          scope: 'resource',
          markdownDescription:
            'Site elevation for notes without a `site:` line, a number with a ' +
            'unit: `1600 m`, `5250 ft`; turned into a pressure with the standard ' +
            'atmosphere. Wins over `#dewmark.pressure#` when set. Empty: not used.',
        },
        'dewmark.inlayHints.properties': {
          order: 4,
          type: 'array',
          items: { type: 'string', enum: HINT_KEYS.map(([k]) => k), enumDescriptions: HINT_KEYS.map(([, d]) => d) },
          uniqueItems: true,
          default: [],
          scope: 'resource',
          markdownDescription:
            'Computed properties shown as inline hints after each state and mix, in this order. ' +
            'Empty: chosen automatically (rh, w, h and dp, or wb where dp is written), leaving out ' +
            'what the note already states. Inline hints also need `#editor.inlayHints.enabled#`.',
        },
        'dewmark.precision': {
          order: 5,
          type: 'integer',
          minimum: 0,
          maximum: 4,
          default: 0,
          scope: 'resource',
          markdownDescription:
            "Decimals shown beyond each quantity's usual engineering precision " +
            'in hovers and inline hints (0 = the usual precision, up to 4).',
        },
        'dewmark.checkClaims': {
          order: 6,
          type: 'boolean',
          default: true,
          scope: 'resource',
          markdownDescription:
            "Compare every property written beyond a state's defining pair (a claim) with the " +
            'computed value, and warn when they differ by more than the written precision.',
        },
        'dewmark.hover.secondaryUnits': {
          order: 7,
          type: 'boolean',
          default: false,
          scope: 'resource',
          markdownDescription: 'Also show every figure of a hover in the other unit system.',
        },
        'dewmark.maxNoteSizeKB': {
          order: 8,
          type: 'integer',
          minimum: 0,
          default: 2048,
          scope: 'resource',
          markdownDescription:
            'Notes longer than this many KB (1 KB = 1024 characters) are not evaluated ' +
            'as you type: they get one information message saying so, and no hints, ' +
            'hovers, chart or problems. Keeps the editor responsive on huge files; ' +
            '`dewmark check` on the command line evaluates any note. 0: no limit.',
        },
        'dewmark.trace.server': {
          order: 9,
          type: 'string',
          enum: ['off', 'messages', 'verbose'],
          enumDescriptions: ['No trace.', "Each message's name.", 'Each message with its content.'],
          default: 'off',
          scope: 'window',
          markdownDescription:
            'Traces the messages between VS Code and the Dewmark ' +
            'language server into Output → Dewmark (for bug reports).',
        },
      },
    },
    configurationDefaults: {
      // The hints after a statement run to about 50 characters; VS Code cuts inline hints at 43 by default.
      '[markdown]': {
        'editor.inlayHints.maximumLength': 0,
        // Under word wrap VS Code may break a line after '.', ',', '/' and '°' (its default list of
        // characters to break after), which splits a hint's figure (`12.⏎9 °C`, `39,⏎700 Btu/h`,
        // `gr/⏎lb`). VS Code's default list without those four: a Markdown line then wraps at its
        // spaces, and a figure (number, no-break space, unit) stays on one visual line
        // (test/e2e/vscode-wrap.test.ts).
        'editor.wordWrapBreakAfterCharacters': WRAP_BREAK_AFTER,
      },
    },
    commands: [
      { command: 'dewmark.switchUnits', title: 'Switch Result Units (SI/IP)', category, icon: '$(symbol-ruler)' },
      { command: 'dewmark.checkWorkspace', title: 'Check All Notes in the Workspace', category, icon: '$(checklist)' },
      { command: 'dewmark.showChart', title: 'Show Psychrometric Chart', category, icon: '$(graph)' },
      {
        command: 'dewmark.toggleChartCases',
        title: 'Chart: Show All States / Follow the Section at the Cursor',
        category,
        icon: '$(layers)',
      },
      { command: 'dewmark.insertResultsTable', title: 'Insert or Refresh Results Table', category, icon: '$(table)' },
      { command: 'dewmark.restartServer', title: 'Restart Language Server', category, icon: '$(debug-restart)' },
      { command: 'dewmark.showLog', title: 'Show Server Log', category, icon: '$(output)' },
    ],
    menus: {
      commandPalette: [
        { command: 'dewmark.switchUnits', when: 'editorLangId == markdown' },
        { command: 'dewmark.checkWorkspace', when: 'workspaceFolderCount > 0 && !dewmark.noWorkspaceCheck' },
        { command: 'dewmark.showChart', when: 'editorLangId == markdown' },
        { command: 'dewmark.toggleChartCases', when: 'dewmark.chartOpen' },
        { command: 'dewmark.insertResultsTable', when: 'editorLangId == markdown && !editorReadonly' },
        { command: 'dewmark.restartServer' },
        { command: 'dewmark.showLog' },
      ],
    },
    // The project file dewmark.json: the editor validates and completes it with the schema.
    jsonValidation: [{ fileMatch: 'dewmark.json', url: './schema/dewmark.schema.json' }],
    // The Markdown preview calls the extension's extendMarkdownIt (client/src/preview.ts).
    'markdown.markdownItPlugins': true,
    'markdown.previewStyles': ['./client/media/preview.css'],
    languages: [
      {
        id: 'dewmark-air',
        aliases: ['Dewmark air statements'],
        configuration: './syntaxes/air.language-configuration.json',
      },
    ],
    grammars: [
      {
        scopeName: 'markdown.dewmark.air.injection',
        path: './syntaxes/air.injection.tmLanguage.json',
        injectTo: ['text.html.markdown'],
        embeddedLanguages: { 'meta.embedded.block.air': 'dewmark-air', 'meta.embedded.inline.air': 'dewmark-air' },
      },
    ],
  },
};

/** Scripts this script owns (other scripts are left alone). */
export const scripts = {
  package: 'node client/package-vsix.mjs',
  'test:electron': 'node --import tsx test/vscode-electron/run.ts',
};

/** Writes (or with --check, verifies) the fields in package.json. */
function main() {
  const text = readFileSync(manifestPath, 'utf8');
  const manifest = JSON.parse(text);
  const want = { ...manifest, ...fields, scripts: { ...(manifest.scripts ?? {}), ...scripts } };

  if (process.argv.includes('--check')) {
    const wrong = [
      ...Object.keys(fields).filter((k) => !isDeepStrictEqual(manifest[k], fields[k])),
      ...Object.keys(scripts)
        .filter((k) => manifest.scripts?.[k] !== scripts[k])
        .map((k) => `scripts.${k}`),
    ];
    if (wrong.length > 0) {
      console.error(
        `package.json differs from client/manifest.mjs in: ${wrong.join(', ')}. Run: node client/manifest.mjs`,
      );
      process.exit(1);
    }
    console.log('package.json holds the extension manifest fields of client/manifest.mjs');
  } else {
    const out = `${JSON.stringify(want, null, 2)}\n`;
    if (out !== text) writeFileSync(manifestPath, out);
    console.log(out === text ? 'package.json already up to date' : 'package.json: extension manifest fields written');
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main();
