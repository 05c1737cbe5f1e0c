/**
 * The server's own bound on V8's heap slack, whatever the editor starts it with.
 *
 * A language server keeps one analysis per open note until the next edit, so nearly everything
 * it allocates lives for one edit, and its live heap stays flat (12.6 MB after 2,000 and after
 * 6,000 edits of a 2,000-line note, by heap snapshots). With V8's defaults its resident memory
 * still grew from 71 MB after opening such a note to 106 MB after 10,000 edits: V8 doubles the
 * young generation up to 2 × 16 MB as objects keep surviving scavenges, and lets the old
 * generation grow to several times its live size before collecting it. VS Code starts the server
 * with Node options that bound both (`@dewmark/protocol`'s `SERVER_EXEC_ARGV`); other editors
 * start it bare. So the server sets the two V8 settings that take effect at run time:
 * - `--semi-space-growth-factor=1`: the young generation keeps the size it reached while the
 *   server's modules loaded (2 × 2 MB semi-spaces on Node 20, where V8 starts at 1 MB each), a few
 *   more scavenges per edit, each cheap because little survives;
 * - `--heap-growing-percent=50`: the old generation is collected once it is 50 % above its live
 *   size after the last collection (instead of up to 4 ×), so each edit's dead analysis goes sooner.
 *   V8 keeps a floor on that step (its heap controller takes the larger of the two with live + 8 MB,
 *   then adds the young generation's capacity), so with a live heap of 10–12 MB the old generation
 *   still swings by about 10 MB between full collections: most of what the bench measures above
 *   the live heap. Of the settings V8 takes at run time only `--optimize-for-size` lowers that
 *   floor (V8's source), and it cost 2.5 × the CPU per edit.
 * The bench (`npm run bench -- hostile`) measures the result over stdio without Node options: 80–82
 * MB after 10,000 edits of that note, where the same server without these settings had 98–103 MB
 * (both runs side by side on a busy 2-core machine); the edits took about 1.5 × the CPU time
 * (27 s against 18 s for the 10,000: more, smaller collections), a fraction of a millisecond each.
 * Setting the growth factor before the modules load instead (the young generation frozen at 2 × 1
 * MB) saved another 3.5 MB after the 10,000 edits of the 2,602-line bench note (74.6 MB against
 * 78.1 MB), but took 1.45 × the CPU (twice the scavenges, three times the full collections: 51 s
 * against 35 s at load 7–8), so it stays after them. When edits pause, V8's memory reducer may
 * bring the heap down to its live size (62 MB on that note), but only about 8 s after a full
 * collection that found the heap some 10 MB larger than when the reducer last acted, so after the
 * bench's 10 s pause the figure was 62 MB in some runs and unchanged in others.
 */
import { setFlagsFromString } from 'node:v8';

/** The V8 settings of the module comment, in the form `node` takes them. */
export const HEAP_SLACK_FLAGS: readonly string[] = ['--semi-space-growth-factor=1', '--heap-growing-percent=50'];

/** Applies {@link HEAP_SLACK_FLAGS} to this process (call it once, before the server starts working). */
export function limitHeapSlack(): void {
  for (const flag of HEAP_SLACK_FLAGS) setFlagsFromString(flag);
}
