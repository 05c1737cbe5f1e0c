/** Entry point of the `dewmark` command (bundled to dist/cli.js). */
import { processIO, run } from './run';

run(process.argv.slice(2), processIO()).then(
  (code) => {
    process.exitCode = code;
  },
  (err: unknown) => {
    process.stderr.write(`dewmark: unexpected failure: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exitCode = 2;
  },
);
