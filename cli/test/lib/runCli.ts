/**
 * Runs the `dewmark` command line in this process (cli/src/run.ts) for the CLI's tests, collecting
 * what it prints and its exit code. Standard input is empty unless `stdin` is given.
 */
import { run, type CliIO } from '../../src/run';

/** What a run printed and returned. */
export interface Captured {
  code: number;
  out: string;
  err: string;
}

/** Runs `dewmark args…` in `cwd`; `stdin` is what the command reads for `-`. */
export async function runCli(args: string[], cwd: string, stdin: Uint8Array = new Uint8Array()): Promise<Captured> {
  let out = '';
  let err = '';
  const io: CliIO = {
    cwd,
    out: (t) => {
      out += t;
    },
    err: (t) => {
      err += t;
    },
    stdin: async () => stdin,
    stderrIsTTY: false,
  };
  const code = await run(args, io);
  return { code, out, err };
}
