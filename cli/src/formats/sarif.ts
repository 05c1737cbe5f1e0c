/**
 * `dewmark check --format sarif`: the diagnostics as a SARIF 2.1.0 log (OASIS Static Analysis
 * Results Interchange Format), the form code-scanning services read. One run, the tool's rules
 * being the diagnostic codes seen, each result pointing at its file and region. Columns are
 * UTF-16 code units, as the CLI's other formats count them, and said so in `columnKind`.
 */
import { pathToFileURL } from 'node:url';
import { isAbsolute, join } from 'node:path';
import type { DiagnosticJson } from '../output';

/** Where a diagnostic code is explained. */
export const CODES_HELP_URI = 'https://dewmark.dev/docs/notation#every-diagnostic';

/** One checked file, as the JSON check format holds it. */
export interface SarifFileInput {
  path: string;
  diagnostics: readonly DiagnosticJson[];
  /** Diagnostics acknowledged by ignore comments (SARIF results with an in-source suppression). */
  suppressed?: readonly (DiagnosticJson & { justification: string })[];
}

const LEVEL: Record<DiagnosticJson['severity'], 'error' | 'warning' | 'note'> = {
  error: 'error',
  warning: 'warning',
  info: 'note',
};

/** A path as a SARIF artifact location: relative to the source root where it is relative. */
function artifactLocation(path: string): Record<string, unknown> {
  if (path === '<stdin>') return { uri: 'stdin', description: { text: 'standard input' } };
  if (isAbsolute(path)) return { uri: pathToFileURL(path).href };
  return { uri: path.split('/').map(encodeURIComponent).join('/'), uriBaseId: '%SRCROOT%' };
}

/** The SARIF log of a check run (`cwd` is the source root relative paths start from). */
export function sarifLog(files: readonly SarifFileInput[], version: string, cwd: string): Record<string, unknown> {
  const ruleIndex = new Map<string, number>();
  const rules: Record<string, unknown>[] = [];
  const results: Record<string, unknown>[] = [];
  for (const f of files) {
    const all: (DiagnosticJson & { justification?: string })[] = [...f.diagnostics, ...(f.suppressed ?? [])];
    const firstSuppressed = f.diagnostics.length;
    for (const [i, d] of all.entries()) {
      let index = ruleIndex.get(d.code);
      if (index === undefined) {
        index = rules.length;
        ruleIndex.set(d.code, index);
        rules.push({
          id: d.code,
          name: d.code,
          helpUri: `${CODES_HELP_URI}`,
          shortDescription: { text: `Dewmark diagnostic ${d.code}` },
        });
      }
      results.push({
        ruleId: d.code,
        ruleIndex: index,
        level: LEVEL[d.severity],
        message: { text: d.message },
        ...(i >= firstSuppressed
          ? { suppressions: [{ kind: 'inSource', ...(d.justification ? { justification: d.justification } : {}) }] }
          : {}),
        locations: [
          {
            physicalLocation: {
              artifactLocation: artifactLocation(f.path),
              region: { startLine: d.line, startColumn: d.column, endLine: d.endLine, endColumn: d.endColumn },
            },
          },
        ],
      });
    }
  }
  const root = pathToFileURL(join(cwd, '/')).href;
  return {
    $schema: 'https://json.schemastore.org/sarif-2.1.0.json',
    version: '2.1.0',
    runs: [
      {
        tool: {
          driver: { name: 'dewmark', version, semanticVersion: version, informationUri: 'https://dewmark.dev', rules },
        },
        originalUriBaseIds: { '%SRCROOT%': { uri: root.endsWith('/') ? root : `${root}/` } },
        columnKind: 'utf16CodeUnits',
        results,
      },
    ],
  };
}
