/**
 * How soon V8 optimises a function in the server process. Importing this module applies it, and
 * the Node server's entry point (./main) imports it before anything else, so that it holds while
 * the bundle's modules initialise.
 *
 * V8 counts how much bytecode a function has run (its interrupt budget) and, once the budget is
 * spent a few times, compiles it with its optimising compiler on a worker thread. Its default
 * budget suits a page that runs most of its code briefly; a language server runs most of its code
 * once (module initialisation: the protocol's type tables, the Markdown parser's entity table, the
 * vocabulary) and a small part for every edit (parse, evaluate, diagnostics). With the default,
 * the one-off code is optimised as well, and what that costs stays resident for the life of the
 * process: the optimising compiler's part of the `node` executable, the memory its worker threads
 * took from the C allocator, and the optimised code with its deoptimisation data. A budget 16
 * times the default (`--interrupt-budget`, 66 KB of bytecode by default) leaves run-once code to
 * the interpreter and the baseline compiler, while the edit path, which runs thousands of times,
 * is still optimised within the first edits.
 *
 * Measured over stdio without Node options (`npm run bench -- hostile`, 10,000 edits of a
 * 2,602-line note, runs alternated on a shared 2-core machine at load 7–10): resident memory after
 * the first diagnostics 63.0 MB against 67.5 MB, after the edits 77.6–78.3 MB against 81.8–82.1
 * MB; the server's CPU time for the edits was no higher (22.8–31.4 s against 28.7–33.2 s, within
 * the noise of that load).
 */
import { setFlagsFromString } from 'node:v8';

/** The setting of the module comment, in the form `node` takes it. */
export const TIER_UP_FLAGS: readonly string[] = ['--interrupt-budget=1081344'];

for (const flag of TIER_UP_FLAGS) setFlagsFromString(flag);
