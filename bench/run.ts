/**
 * `npm run bench`: every benchmark of the project in one run. Each suite prints its own figures
 * (medians over several rounds, ratios against PsychroLib where it applies). Speed goals are
 * checked here, never in timed unit tests.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { dirname, join } from 'node:path';

const here = dirname(fileURLToPath(import.meta.url));

/** Suites in the order they print: file name and exported function. */
const suites: [file: string, fn: string][] = [
  ['engine.ts', 'benchEngine'],
  ['parse.ts', 'benchParse'],
  ['notes.ts', 'benchNotes'],
  ['preview.ts', 'benchPreview'],
  ['server.ts', 'benchServer'],
  ['extension.ts', 'benchExtension'],
  ['robustness.ts', 'benchRobustness'],
  ['hostile.ts', 'benchHostile'],
];

const only = process.argv.slice(2);
let failed = 0;
for (const [file, fn] of suites) {
  if (only.length > 0 && !only.some((o) => file.startsWith(o))) continue;
  const path = join(here, file);
  if (!existsSync(path)) continue;
  console.log(`\n== ${file} ==`);
  try {
    const mod = (await import(pathToFileURL(path).href)) as Record<string, () => Promise<void>>;
    const run = mod[fn];
    if (typeof run !== 'function') throw new Error(`${file} does not export ${fn}()`);
    await run();
  } catch (err) {
    failed++;
    console.error(`benchmark ${file} failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
  }
}
process.exitCode = failed > 0 ? 1 : 0;
