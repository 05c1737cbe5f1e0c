/** Entry point of the `dewmark` command (bundled to dist/cli.js; worker threads run it too). */
import { processIO, run } from './run';
import { workerMain } from './work';

/** Runs the command line in the main thread (a closed output pipe ends quietly: see `processIO`). */
function startCli(): void {
  const io = processIO();
  run(process.argv.slice(2), io).then(
    (code) => {
      process.exitCode = code;
    },
    (err: unknown) => {
      io.err(`dewmark: unexpected failure: ${err instanceof Error ? err.message : String(err)}\n`);
      process.exitCode = 2;
    },
  );
}

if (!workerMain()) startCli();
