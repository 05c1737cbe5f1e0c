/**
 * Images of a note for `dewmark report`: a path relative to the note's folder is read and put into
 * the report as a `data:` URI, so the report stays one self-contained file that loads nothing.
 * Only real images are included (PNG, JPEG, GIF and WebP by their first bytes; SVG by its name and
 * an `<svg` element — an SVG shown as an image runs no script), up to {@link MAX_IMAGE_BYTES}.
 * A URL, an absolute path, a missing file or anything else is left out with the reason, which the
 * report shows in the image's place.
 */
import { readFileSync, statSync } from 'node:fs';
import { dirname, isAbsolute, resolve } from 'node:path';
import type { ImageAnswer } from '@dewmark/core/present';

/** The largest image put into a report. */
export const MAX_IMAGE_BYTES = 8 * 1024 * 1024;

/** The image type of the bytes, by their signature; null when they are not a known image. */
function imageType(bytes: Buffer, path: string): string | null {
  const starts = (...b: number[]) => b.every((x, i) => bytes[i] === x);
  if (starts(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a)) return 'image/png';
  if (starts(0xff, 0xd8, 0xff)) return 'image/jpeg';
  if (bytes.subarray(0, 6).toString('latin1') === 'GIF87a' || bytes.subarray(0, 6).toString('latin1') === 'GIF89a')
    return 'image/gif';
  if (bytes.subarray(0, 4).toString('latin1') === 'RIFF' && bytes.subarray(8, 12).toString('latin1') === 'WEBP')
    return 'image/webp';
  if (/\.svg$/i.test(path) && /<svg[\s>]/.test(bytes.subarray(0, 4096).toString('utf8'))) return 'image/svg+xml';
  return null;
}

/** The image `src` of a note at `noteAbs` (null: read from standard input) as a `data:` URI, or why not. */
export function resolveImage(src: string, noteAbs: string | null): ImageAnswer {
  if (/^[a-z][a-z0-9+.-]*:/i.test(src) || src.startsWith('//'))
    return { ok: false, reason: 'not a file beside the note (the report loads nothing from elsewhere)' };
  if (src === '') return { ok: false, reason: 'no path given' };
  let path: string;
  try {
    path = decodeURI(src.replace(/[?#].*$/, ''));
  } catch {
    return { ok: false, reason: 'the path is not valid percent-encoding' };
  }
  if (isAbsolute(path)) return { ok: false, reason: 'an absolute path; write it relative to the note' };
  if (noteAbs === null)
    return { ok: false, reason: 'the note was read from standard input, so a relative path has no folder' };
  const abs = resolve(dirname(noteAbs), path);
  let size: number;
  try {
    const st = statSync(abs);
    if (!st.isFile()) return { ok: false, reason: 'not a file' };
    size = st.size;
  } catch {
    return { ok: false, reason: 'no such file beside the note' };
  }
  if (size > MAX_IMAGE_BYTES)
    return { ok: false, reason: `larger than ${MAX_IMAGE_BYTES / 1024 / 1024} MB; use a smaller image` };
  let bytes: Buffer;
  try {
    bytes = readFileSync(abs);
  } catch (err) {
    return { ok: false, reason: `could not be read (${(err as NodeJS.ErrnoException).code ?? 'error'})` };
  }
  const type = imageType(bytes, abs);
  if (!type) return { ok: false, reason: 'not a PNG, JPEG, GIF, WebP or SVG image' };
  return { ok: true, dataUri: `data:${type};base64,${bytes.toString('base64')}` };
}
