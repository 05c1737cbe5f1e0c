/**
 * The TextMate injection grammar (syntaxes/air.injection.tmLanguage.json) tokenized with the same
 * engine VS Code uses (vscode-textmate + vscode-oniguruma). Each check names the token text and the
 * standard scope a theme colours it by. The host is a small stand-in Markdown grammar with a
 * generic fence rule (so the injection must win over it), and, where the editor-test tools are
 * installed, also VS Code's own Markdown grammar shipped inside code-server.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import * as oniguruma from 'vscode-oniguruma';
import * as vsctm from 'vscode-textmate';

const root = join(__dirname, '..', '..');
const injectionPath = join(root, 'syntaxes', 'air.injection.tmLanguage.json');
const injection = JSON.parse(readFileSync(injectionPath, 'utf8')) as { scopeName: string; injectionSelector: string };
const standInHost = join(root, 'test', 'fixtures', 'grammar', 'markdown-host.tmLanguage.json');
const toolsDir = process.env.DEWMARK_E2E_TOOLS_DIR ?? join(root, '.e2e-tools');
const vscodeHost = join(
  toolsDir,
  'node_modules',
  'code-server',
  'lib',
  'vscode',
  'extensions',
  'markdown-basics',
  'syntaxes',
  'markdown.tmLanguage.json',
);

let onigReady: Promise<void> | null = null;
function loadOniguruma(): Promise<void> {
  onigReady ??= oniguruma.loadWASM(
    readFileSync(join(root, 'node_modules', 'vscode-oniguruma', 'release', 'onig.wasm')).buffer as ArrayBuffer,
  );
  return onigReady;
}

/** One token: its text and its scopes, outermost first. */
interface Token {
  text: string;
  scopes: string[];
}

async function tokenizer(hostPath: string): Promise<(text: string) => Token[][]> {
  await loadOniguruma();
  const registry = new vsctm.Registry({
    onigLib: Promise.resolve({
      createOnigScanner: (patterns: string[]) => new oniguruma.OnigScanner(patterns),
      createOnigString: (s: string) => new oniguruma.OnigString(s),
    }),
    loadGrammar: async (scopeName: string) => {
      const path =
        scopeName === 'text.html.markdown' ? hostPath : scopeName === injection.scopeName ? injectionPath : null;
      if (!path) return null;
      return vsctm.parseRawGrammar(readFileSync(path, 'utf8'), path);
    },
    getInjections: (scopeName: string) => (scopeName === 'text.html.markdown' ? [injection.scopeName] : undefined),
  });
  const grammar = await registry.loadGrammar('text.html.markdown');
  if (!grammar) throw new Error(`could not load the Markdown host grammar from ${hostPath}`);
  return (text: string) => {
    let stack = vsctm.INITIAL;
    return text.split('\n').map((line) => {
      const r = grammar.tokenizeLine(line, stack);
      stack = r.ruleStack;
      return r.tokens.map((t) => ({ text: line.slice(t.startIndex, t.endIndex), scopes: t.scopes }));
    });
  };
}

/** The scopes of the first token on `line` whose text is exactly `text` (fails when absent). */
function scopesOf(lines: Token[][], line: number, text: string): string[] {
  const tokens = lines[line];
  if (!tokens) throw new Error(`no line ${line}`);
  const tok = tokens.find((t) => t.text === text);
  if (!tok) throw new Error(`no token '${text}' on line ${line}; tokens: ${JSON.stringify(tokens.map((t) => t.text))}`);
  return tok.scopes;
}

const note = [
  '# Level 3 air handler', //                                 0
  '',
  '```air', //                                                2
  'site: elev=1600m            # sets pressure for what follows',
  'state OA: db=33C wb=23C', //                               4
  'state RA: db=24°C rh=50% h=47.8kJ/kg±0.2',
  'mix MA: OA 25% + RA 75%', //                               6
  'process CC: MA -> SA q=4.8m3/s',
  'units: IP', //                                             8
  'state AHU-3_off: db=-5.5C w=2.1g/kg',
  '```', //                                                  10
  '',
  'Plain prose with state words and db=24C outside any block.', // 12
  '',
  'The room is held at `state RA: db=24C rh=50%` in summer, and `db=24C` is not a statement.', // 14
  '',
  '```python', //                                            16
  'state = 3  # not air',
  '```',
].join('\n');

function checkNote(lines: Token[][]): void {
  // The fence itself and the block's content scope.
  expect(scopesOf(lines, 2, 'air')).toContain('fenced_code.block.language.markdown');
  expect(scopesOf(lines, 4, 'state')).toContain('meta.embedded.block.air');
  // Keywords.
  for (const [line, kw] of [
    [3, 'site'],
    [4, 'state'],
    [6, 'mix'],
    [7, 'process'],
    [8, 'units'],
  ] as const) {
    expect(scopesOf(lines, line, kw), kw).toContain(`keyword.control.${kw}.air`);
  }
  // Names being defined, and names referred to.
  expect(scopesOf(lines, 4, 'OA')).toContain('entity.name.type.state.air');
  expect(scopesOf(lines, 6, 'MA')).toContain('entity.name.type.mix.air');
  expect(scopesOf(lines, 7, 'CC')).toContain('entity.name.type.process.air');
  expect(scopesOf(lines, 9, 'AHU-3_off')).toContain('entity.name.type.state.air');
  expect(scopesOf(lines, 6, 'OA')).toContain('variable.other.state.air');
  expect(scopesOf(lines, 7, 'SA')).toContain('variable.other.state.air');
  // Property keys and operators.
  for (const [line, key] of [
    [3, 'elev'],
    [4, 'db'],
    [4, 'wb'],
    [5, 'rh'],
    [5, 'h'],
    [7, 'q'],
    [9, 'w'],
  ] as const) {
    const s = scopesOf(lines, line, key);
    expect(s.join(' '), key).toContain('support.type.property-name.air');
    expect(s.join(' '), key).toContain('variable.parameter.property.air');
  }
  expect(scopesOf(lines, 4, '=')).toContain('keyword.operator.assignment.air');
  expect(scopesOf(lines, 7, '->')).toContain('keyword.operator.arrow.air');
  expect(scopesOf(lines, 6, '+')).toContain('keyword.operator.arithmetic.air');
  // Numbers and their units, as separate tokens.
  for (const [line, num, unit] of [
    [3, '1600', 'm'],
    [4, '33', 'C'],
    [5, '24', '°C'],
    [5, '50', '%'],
    [5, '47.8', 'kJ/kg'],
    [6, '25', '%'],
    [7, '4.8', 'm3/s'],
    [9, '-5.5', 'C'],
    [9, '2.1', 'g/kg'],
  ] as const) {
    expect(scopesOf(lines, line, num), num).toContain('constant.numeric.air');
    expect(scopesOf(lines, line, unit), `${num}${unit}`).toContain('keyword.other.unit.air');
  }
  expect(scopesOf(lines, 5, '±')).toContain('keyword.operator.tolerance.air');
  expect(scopesOf(lines, 5, '0.2')).toContain('constant.numeric.air');
  expect(scopesOf(lines, 8, 'IP')).toContain('constant.language.unit-system.air');
  // Comments.
  expect(scopesOf(lines, 3, ' sets pressure for what follows')).toContain('comment.line.number-sign.air');
  expect(scopesOf(lines, 3, '#')).toContain('punctuation.definition.comment.air');
  // The closing fence ends the block: prose after it is not air.
  expect(scopesOf(lines, 10, '```').join(' ')).not.toContain('meta.embedded.block.air');
  for (const t of lines[12] ?? []) expect(t.scopes.join(' '), t.text).not.toMatch(/\.air\b/);
  // Inline code spans that start with a keyword are highlighted; other spans are not.
  expect(scopesOf(lines, 14, 'state')).toContain('keyword.control.state.air');
  expect(scopesOf(lines, 14, 'RA')).toContain('entity.name.type.state.air');
  expect(scopesOf(lines, 14, '50')).toContain('constant.numeric.air');
  const tail = (lines[14] ?? []).filter((t) => t.text.includes(' in summer'));
  expect(tail.length).toBe(1);
  expect(tail[0]!.scopes.join(' ')).not.toMatch(/\.air\b/);
  const otherSpan = (lines[14] ?? []).filter((t) => t.text.includes('db=24C') && !t.scopes.join(' ').includes('.air'));
  expect(otherSpan.length, 'the span `db=24C` stays plain inline code').toBeGreaterThan(0);
  // Other fences are left to the host grammar.
  for (const t of lines[17] ?? []) expect(t.scopes.join(' '), t.text).not.toMatch(/\.air\b/);
}

describe('air injection grammar', () => {
  it('declares an injection into Markdown', () => {
    expect(injection.injectionSelector).toBe('L:text.html.markdown');
  });

  it('scopes keywords, names, keys, numbers, units and comments (stand-in Markdown host)', async () => {
    const tokenize = await tokenizer(standInHost);
    checkNote(tokenize(note));
  });

  it('a fence indented inside a list item and a tilde fence are air blocks too', async () => {
    const tokenize = await tokenizer(standInHost);
    const lines = tokenize(
      [
        '- step one',
        '',
        '  ```air',
        '  state X: db=20C rh=40%',
        '  ```',
        '',
        '~~~air',
        'state Y: db=21C rh=41%',
        '~~~',
        'plain db=1C',
      ].join('\n'),
    );
    expect(scopesOf(lines, 3, 'state')).toContain('keyword.control.state.air');
    expect(scopesOf(lines, 7, 'Y')).toContain('entity.name.type.state.air');
    for (const t of lines[9] ?? []) expect(t.scopes.join(' '), t.text).not.toMatch(/\.air\b/);
  });

  it('a number with thousands separators is one number token', async () => {
    const tokenize = await tokenizer(standInHost);
    const lines = tokenize(['```air', 'process CC: MA -> OFF q=8,745cfm q_total=169,100Btu/h', '```'].join('\n'));
    expect(scopesOf(lines, 1, '8,745')).toContain('constant.numeric.air');
    expect(scopesOf(lines, 1, 'cfm')).toContain('keyword.other.unit.air');
    expect(scopesOf(lines, 1, '169,100')).toContain('constant.numeric.air');
    expect(scopesOf(lines, 1, 'Btu/h')).toContain('keyword.other.unit.air');
  });

  it('a property reference: the state, the dot, the key and a signed difference with its unit', async () => {
    const tokenize = await tokenizer(standInHost);
    const lines = tokenize(['```air', 'state PH: db=OA.dp+8K w=AHU-3.w', '```'].join('\n'));
    expect(scopesOf(lines, 1, 'OA')).toContain('variable.other.state.air');
    expect(scopesOf(lines, 1, 'AHU-3')).toContain('variable.other.state.air');
    expect(scopesOf(lines, 1, 'db').join(' ')).toContain('support.type.property-name.air');
    expect(scopesOf(lines, 1, 'dp').join(' ')).toContain('variable.other.property.air');
    expect(scopesOf(lines, 1, '.')).toContain('punctuation.accessor.air');
    expect(scopesOf(lines, 1, '+8')).toContain('constant.numeric.air');
    expect(scopesOf(lines, 1, 'K')).toContain('keyword.other.unit.air');
  });

  it('a supply line: keyword, the name it defines, the room state it names', async () => {
    const tokenize = await tokenizer(standInHost);
    const lines = tokenize(
      [
        '```air',
        'supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C',
        '```',
        'In prose, `supply SB: RA q_sensible=1kW q_latent=0kW m=1kg/s` too.',
      ].join('\n'),
    );
    expect(scopesOf(lines, 1, 'supply')).toContain('keyword.control.supply.air');
    expect(scopesOf(lines, 1, 'SA')).toContain('entity.name.type.supply.air');
    expect(scopesOf(lines, 1, 'RA')).toContain('variable.other.state.air');
    expect(scopesOf(lines, 3, 'supply')).toContain('keyword.control.supply.air');
  });

  const haveVscodeMarkdown = existsSync(vscodeHost);
  const ci = process.env.CI === 'true' || process.env.CI === '1';
  const skipped = ' (SKIPPED: code-server is not installed in .e2e-tools; run scripts/setup-e2e-tools.sh)';
  it.skipIf(!haveVscodeMarkdown && !ci)(
    `the same checks against VS Code's own Markdown grammar${haveVscodeMarkdown ? '' : skipped}`,
    async () => {
      if (!haveVscodeMarkdown)
        throw new Error(
          `CI=true and VS Code's Markdown grammar is missing at ${vscodeHost}: run scripts/setup-e2e-tools.sh`,
        );
      const tokenize = await tokenizer(vscodeHost);
      checkNote(tokenize(note));
    },
  );
});
