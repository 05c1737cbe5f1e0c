/**
 * Open documents (incremental sync) and one cached analysis per uri + version + settings
 * generation. A change drops the document's analysis; the next request or diagnostics run
 * computes it again from the synchronised text (never from disk), through the document's own
 * analyzer, which reuses what the edit did not touch (same result as a fresh analysis).
 */
import { TextDocuments, type Connection } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { createAnalyzer, type Analyzer } from '@dewmark/core/analyze';
import { analyzeTextWith, type Note } from '@dewmark/core/service';
import type { Configuration } from './configuration';

/** A document with its analysis. */
export interface NoteDocument {
  doc: TextDocument;
  note: Note;
}

interface CacheEntry {
  version: number;
  generation: number;
  note: Note;
}

/** The open documents and their analyses. */
export class NoteStore {
  /** The synchronised documents (listen() wires them to the connection). */
  readonly documents = new TextDocuments(TextDocument);
  private readonly cache = new Map<string, CacheEntry>();
  /** One analyzer per open document: it keeps the document's previous analysis to reuse. */
  private readonly analyzers = new Map<string, Analyzer>();

  constructor(private readonly config: Configuration) {
    this.documents.onDidChangeContent((e) => this.cache.delete(e.document.uri));
    this.documents.onDidClose((e) => {
      this.cache.delete(e.document.uri);
      this.analyzers.delete(e.document.uri);
      this.config.forget(e.document.uri);
    });
    this.config.onDidChange(() => this.cache.clear());
  }

  /** Starts synchronising documents over the connection. */
  listen(connection: Connection): void {
    this.documents.listen(connection);
  }

  /** The open document for `uri`, if any. */
  document(uri: string): TextDocument | undefined {
    return this.documents.get(uri);
  }

  /**
   * The analysed note for an open document, or null when it is not open. Resolves against the
   * text as it is once the settings are known; callers compare `doc.version` if that matters.
   */
  async get(uri: string): Promise<NoteDocument | null> {
    const first = this.documents.get(uri);
    if (!first) return null;
    const cached = this.cache.get(uri);
    if (cached && cached.version === first.version && cached.generation === this.config.generation) {
      return { doc: first, note: cached.note };
    }
    const generation = this.config.generation;
    const settings = await this.config.get(uri);
    const doc = this.documents.get(uri);
    if (!doc) return null;
    const again = this.cache.get(uri);
    if (again && again.version === doc.version && again.generation === generation) return { doc, note: again.note };
    let analyzer = this.analyzers.get(uri);
    if (!analyzer) {
      analyzer = createAnalyzer();
      this.analyzers.set(uri, analyzer);
    }
    const note = analyzeTextWith(analyzer, doc.getText(), settings);
    if (generation === this.config.generation) this.cache.set(uri, { version: doc.version, generation, note });
    return { doc, note };
  }
}
