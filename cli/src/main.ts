/** Entry point of the `dewmark` command (bundled to dist/cli.js; worker threads run it too). */
import { processIO, run } from './run';
import { workerMain } from './work';

/** Runs the command line in the main thread. */
function startCli(): void {
  // A closed pipe (`dewmark check | head`) ends the output quietly.
  for (const stream of [process.stdout, process.stderr]) {
    stream.on('error', (err: NodeJS.ErrnoException) => {
      if (err.code === 'EPIPE') process.exit(process.exitCode ?? 0);
      throw err;
    });
  }
  run(process.argv.slice(2), processIO()).then(
    (code) => {
      process.exitCode = code;
    },
    (err: unknown) => {
      process.stderr.write(`dewmark: unexpected failure: ${err instanceof Error ? err.message : String(err)}\n`);
      process.exitCode = 2;
    },
  );
}

if (!workerMain()) startCli();
