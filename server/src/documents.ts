/**
 * Open documents (incremental sync) and one cached analysis per uri + version + settings
 * generation. A change drops the document's analysis; the next request or diagnostics run
 * computes it again from the synchronised text (never from disk), through the document's own
 * analyzer, which reuses what the edit did not touch (same result as a fresh analysis).
 *
 * A long analysis runs in slices of a few milliseconds with the event loop free in between, so
 * other documents' requests, cancellations and edits are served while it runs; requests for the
 * same version share one run, and a run whose document changed is dropped for the new text.
 */
import { TextDocuments, type Connection } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { createAnalyzer, type Analyzer } from '@dewmark/core/analyze';
import { analyzeTextSteps, type Note } from '@dewmark/core/service';
import type { Configuration } from './configuration';
import { nextTurn } from './turn';

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

/** An analysis in progress. */
interface Running {
  version: number;
  generation: number;
  result: Promise<NoteDocument | null>;
}

/**
 * Work done before the event loop is given a turn, ms (short enough that a keystroke's request is not kept waiting).
 */
const SLICE_MS = 8;

/** The open documents and their analyses. */
export class NoteStore {
  /** The synchronised documents (listen() wires them to the connection). */
  readonly documents = new TextDocuments(TextDocument);
  private readonly cache = new Map<string, CacheEntry>();
  /** One analyzer per open document: it keeps the document's previous analysis to reuse. */
  private readonly analyzers = new Map<string, Analyzer>();
  private readonly running = new Map<string, Running>();

  constructor(private readonly config: Configuration) {
    this.documents.onDidChangeContent((e) => this.cache.delete(e.document.uri));
    this.documents.onDidClose((e) => {
      this.cache.delete(e.document.uri);
      this.analyzers.delete(e.document.uri);
      this.running.delete(e.document.uri);
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
    const busy = this.running.get(uri);
    if (busy && busy.version === doc.version && busy.generation === generation) return busy.result;
    const run: Running = { version: doc.version, generation, result: Promise.resolve(null) };
    run.result = this.analyze(uri, doc, settings, run);
    this.running.set(uri, run);
    return run.result;
  }

  /** Runs the analysis of `doc` in slices; null when the document closed meanwhile. */
  private async analyze(
    uri: string,
    doc: TextDocument,
    settings: Awaited<ReturnType<Configuration['get']>>,
    run: Running,
  ): Promise<NoteDocument | null> {
    let analyzer = this.analyzers.get(uri);
    if (!analyzer) {
      analyzer = createAnalyzer();
      this.analyzers.set(uri, analyzer);
    }
    const steps = analyzeTextSteps(analyzer, doc.getText(), settings);
    try {
      for (;;) {
        const until = performance.now() + SLICE_MS;
        let r = steps.next();
        while (!r.done && performance.now() < until) r = steps.next();
        if (r.done) {
          if (run.generation === this.config.generation)
            this.cache.set(uri, { version: run.version, generation: run.generation, note: r.value });
          return { doc, note: r.value };
        }
        await nextTurn();
        // Dropped when it is no longer the run for this document (changed, closed, settings changed).
        if (
          this.running.get(uri) !== run ||
          this.documents.get(uri)?.version !== run.version ||
          this.config.generation !== run.generation
        ) {
          if (this.running.get(uri) === run) this.running.delete(uri);
          return this.get(uri);
        }
      }
    } finally {
      if (this.running.get(uri) === run) this.running.delete(uri);
    }
  }
}
