/**
 * `dewmark check --format github`: one GitHub Actions workflow command per diagnostic
 * (`::error file=…,line=…,col=…,endLine=…,endColumn=…,title=…::message`), which the runner turns
 * into annotations on the changed lines. Values are escaped as the workflow-command syntax
 * requires (`%`, CR and LF in the message; also `:` and `,` in properties), after control
 * characters are made visible, so a file name or note text can neither end the command early nor
 * start another one.
 */
import type { DiagnosticJson } from '../output';
import { safeText } from '../sanitize';

/** The workflow command for each severity (GitHub has no "info"; "notice" is its nearest). */
const COMMAND: Record<DiagnosticJson['severity'], string> = { error: 'error', warning: 'warning', info: 'notice' };

/** Escapes a command's message. */
export function escapeData(s: string): string {
  return s.replace(/%/g, '%25').replace(/\r/g, '%0D').replace(/\n/g, '%0A');
}

/** Escapes a command property's value. */
export function escapeProperty(s: string): string {
  return escapeData(s).replace(/:/g, '%3A').replace(/,/g, '%2C');
}

/** The annotation lines of one checked file. */
export function githubAnnotations(path: string, diagnostics: readonly DiagnosticJson[]): string {
  const file = escapeProperty(safeText(path));
  let out = '';
  for (const d of diagnostics) {
    const props = [
      `file=${file}`,
      `line=${d.line}`,
      `col=${d.column}`,
      `endLine=${d.endLine}`,
      `endColumn=${d.endColumn}`,
      `title=${escapeProperty(`dewmark ${d.code}`)}`,
    ];
    const message = escapeData(safeText(d.message.replace(/\s*\n\s*/g, ' ')));
    out += `::${COMMAND[d.severity]} ${props.join(',')}::${message}\n`;
  }
  return out;
}
