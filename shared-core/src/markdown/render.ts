/**
 * The markdown-it set-up that renders a note to HTML (the review report; see
 * `present/noteHtml.ts`). It is the set-up VS Code's Markdown preview uses — markdown-it's
 * `default` preset (CommonMark plus tables and strikethrough), no typographer, no line-break
 * conversion, no bare-URL links — with one difference: raw HTML written in the note is shown as
 * text, never passed through as markup, so nothing the note holds (a `<script>`, an `onerror=`)
 * can reach the report as code. markdown-it's own link check stays on: `javascript:`,
 * `vbscript:`, `file:` and non-image `data:` links are not made links.
 *
 * The fences and code spans this parser sees are the ones {@link scanMarkdown} (`./scan`) finds:
 * both follow CommonMark for fences and code spans (the scanner's instance is instrumented for
 * exact positions and cannot render, which is why this is a second instance).
 */
import MarkdownIt from 'markdown-it';
import type { MarkdownIt as Md } from 'markdown-it';

/** A markdown-it instance that renders notes (see the module comment). */
export type NoteRenderer = Md;

/** Token type of markdown-it, for the renderers that add results after blocks and code spans. */
export type { Token as RenderToken } from 'markdown-it';

/** Creates the rendering instance (see the module comment). Cheap; a caller may keep one. */
export function createRenderMarkdownIt(): NoteRenderer {
  return new MarkdownIt('default', { html: false, linkify: false, typographer: false, breaks: false });
}
