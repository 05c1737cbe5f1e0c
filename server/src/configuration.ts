/**
 * Settings: fetched per document with `workspace/configuration` (scopeUri) when the client offers
 * it, otherwise taken from `didChangeConfiguration` pushes or `initializationOptions`, otherwise the
 * defaults (Neovim 0.7 offers none of these). Over them, the nearest project file `dewmark.json`
 * above the note sets what it names: the editor's settings fill only what it leaves open. Which
 * project files can be read is the host's ({@link ProjectFiles}: local notes' on the Node server,
 * notes inside a workspace folder through the client in the web build). Project files are re-read when the client
 * reports one changed (watched files) and after a settings change. Invalid values are reported once and replaced by
 * their defaults.
 */
import {
  DidChangeConfigurationNotification,
  DidChangeWatchedFilesNotification,
  MessageType,
  ShowMessageNotification,
  type Connection,
  type InitializeParams,
} from 'vscode-languageserver/node';
import {
  PROJECT_FILE,
  mergeSection,
  readSettings,
  type ProjectConfig,
  type ServiceSettings,
} from '@dewmark/core/service';
import { SETTINGS_SECTION } from '@dewmark/protocol';
import type { ProjectFiles } from './projectFiles';

/** Per-document settings with change notification. */
export class Configuration {
  private pullSupported = false;
  private dynamicChange = false;
  private watchFiles = false;
  /** The settings section pushed by the client (or given at initialize), used when it cannot be asked. */
  private pushed: unknown = null;
  private readonly perUri = new Map<string, Promise<ServiceSettings>>();
  private readonly reported = new Set<string>();
  private readonly listeners: (() => void)[] = [];
  /** Bumped on every change, so caches keyed on it go stale. */
  generation = 0;
  /** The workspace folders' URIs, kept current by the server: project files are named relative to them. */
  folders: () => readonly string[] = () => [];

  /**
   * `projectFiles` reads the project files (the disk for the Node server, the client's file system for the web build).
   */
  constructor(
    private readonly connection: Connection,
    private readonly projectFiles: ProjectFiles,
  ) {}

  /** Reads the client's configuration capabilities and any initial settings. */
  initialize(params: InitializeParams): void {
    const ws = params.capabilities.workspace;
    this.pullSupported = ws?.configuration === true;
    this.dynamicChange = ws?.didChangeConfiguration?.dynamicRegistration === true;
    this.watchFiles = ws?.didChangeWatchedFiles?.dynamicRegistration === true;
    const init = params.initializationOptions as Record<string, unknown> | null | undefined;
    if (init && typeof init === 'object' && init[SETTINGS_SECTION] !== undefined) {
      this.pushed = init[SETTINGS_SECTION];
      this.read(this.pushed, null); // reports its problems now
    }
    this.connection.onDidChangeConfiguration((change) => {
      const settings = (change.settings ?? null) as Record<string, unknown> | null;
      if (settings && typeof settings === 'object' && settings[SETTINGS_SECTION] !== undefined) {
        this.pushed = settings[SETTINGS_SECTION];
      }
      this.changed();
    });
    this.connection.onDidChangeWatchedFiles((change) => {
      if (change.changes.some((c) => c.uri.endsWith(`/${PROJECT_FILE}`))) this.changed();
    });
  }

  /** Forgets every document's settings and the project files read, and tells the listeners. */
  private changed(): void {
    this.perUri.clear();
    this.projectFiles.clear();
    this.generation++;
    for (const l of this.listeners) l();
  }

  /** Registers for configuration changes once the client is initialized (when it allows dynamic registration). */
  initialized(): void {
    if (this.dynamicChange) {
      void this.connection.client
        .register(DidChangeConfigurationNotification.type, { section: SETTINGS_SECTION })
        .catch((err: unknown) =>
          this.connection.console.warn(`could not register for configuration changes: ${String(err)}`),
        );
    }
    if (this.watchFiles) {
      void this.connection.client
        .register(DidChangeWatchedFilesNotification.type, { watchers: [{ globPattern: `**/${PROJECT_FILE}` }] })
        .catch((err: unknown) => this.connection.console.warn(`could not watch ${PROJECT_FILE} files: ${String(err)}`));
    }
  }

  /** Calls `listener` after every settings change. */
  onDidChange(listener: () => void): void {
    this.listeners.push(listener);
  }

  /** The settings for one document (asked once per document until the next change). */
  get(uri: string): Promise<ServiceSettings> {
    let p = this.perUri.get(uri);
    if (!p) {
      const section: Promise<unknown> = !this.pullSupported
        ? Promise.resolve(this.pushed)
        : this.connection.workspace.getConfiguration({ scopeUri: uri, section: SETTINGS_SECTION }).then(
            (raw: unknown) => (raw === null || raw === undefined ? this.pushed : raw),
            (err: unknown) => {
              this.connection.console.warn(`workspace/configuration failed, using defaults: ${String(err)}`);
              return this.pushed;
            },
          );
      p = section.then(async (raw) => {
        const project = await this.projectFor(uri);
        return this.read(mergeSection(raw as Record<string, unknown> | null, project), project, uri);
      });
      this.perUri.set(uri, p);
    }
    return p;
  }

  /** The nearest project file above the note, or null; a failure to read is logged and read as none. */
  private async projectFor(uri: string): Promise<ProjectConfig | null> {
    try {
      return await this.projectFiles.find(uri);
    } catch (err) {
      this.connection.console.warn(`${PROJECT_FILE} above ${uri} could not be read: ${String(err)}`);
      return null;
    }
  }

  /** Forgets a closed document's settings. */
  forget(uri: string): void {
    this.perUri.delete(uri);
  }

  private read(raw: unknown, project: ProjectConfig | null, uri?: string): ServiceSettings {
    const { settings, problems } = readSettings(raw);
    // Where the file's values came from (hovers name it), and whether its include/exclude leave the note out.
    if (project && uri !== undefined) Object.assign(settings, this.projectFiles.scope(project, uri, this.folders()));
    const named = project ? [...project.problems.map((p) => `${project.path}: ${p}`), ...problems] : problems;
    for (const problem of named) {
      if (this.reported.has(problem)) continue;
      this.reported.add(problem);
      // A notification (allowed even before the initialize result), and the log for later reading.
      void this.connection.sendNotification(ShowMessageNotification.type, {
        type: MessageType.Warning,
        message: `Dewmark settings: ${problem}`,
      });
      this.connection.console.warn(`settings: ${problem}`);
    }
    return settings;
  }
}
