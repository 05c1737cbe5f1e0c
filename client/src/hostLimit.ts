/**
 * The extension host runs every extension of the window on one thread: the preview's results and
 * the chart, drawn there, never evaluate an unbounded note. They follow `dewmark.maxNoteSizeKB`,
 * but never go past {@link HOST_MAX_NOTE_KB} — also when the setting is 0 (no limit), which then
 * lifts the limit only for the language server (its own process, which pauses between slices of
 * a long analysis). `dewmark check`/`dewmark chart` on the command line take any size.
 */
import type { ServiceSettings } from '@dewmark/core/service';

/** The most the preview and the chart evaluate inside VS Code, KB (1 KB = 1024 characters). */
export const HOST_MAX_NOTE_KB = 8192;

/** `settings` with the size limit bounded for the extension host. */
export function hostBounded(settings: ServiceSettings): ServiceSettings {
  if (settings.maxNoteKB > 0 && settings.maxNoteKB <= HOST_MAX_NOTE_KB) return settings;
  return { ...settings, maxNoteKB: HOST_MAX_NOTE_KB };
}
