/**
 * The Node options the VS Code client starts the language server with (its ServerOptions
 * `execArgv`; bench/server.ts measures the server started the same way).
 *
 * They bound the V8 heap's slack, not its contents. A language server keeps one analysis per open
 * note until the next edit, so nearly everything it allocates lives exactly one edit: with the
 * defaults V8 grows the young generation to 2 × 16 MB and lets the old generation (where each
 * edit's copy of the note's text lands) reach several times its live size before collecting it,
 * which on a 10,000-line note took the server from ~82 MB after opening to 110–120 MB after 40
 * quick edits. A 2 MB semi-space keeps the young generation at 4 MB (a few more scavenges per
 * edit, each cheap because little survives); an old-space limit of 1 GB makes V8 use its smaller
 * heap-growing factors (the factor scales with the limit), so dead texts are collected sooner.
 * 1 GB is far above what the largest notes need. Both options are stable Node options, accepted
 * by the Node inside VS Code too.
 *
 * Other editors start `dewmark-language-server` themselves; they can pass the same options:
 * `node --max-semi-space-size=2 --max-old-space-size=1024 path/to/bin/dewmark-language-server.js --stdio`.
 */
export const SERVER_EXEC_ARGV: readonly string[] = ['--max-semi-space-size=2', '--max-old-space-size=1024'];
