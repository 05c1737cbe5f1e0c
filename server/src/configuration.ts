/**
 * Settings: fetched per document with `workspace/configuration` (scopeUri) when the client offers
 * it, otherwise taken from `didChangeConfiguration` pushes or `initializationOptions`, otherwise the
 * defaults (Neovim 0.7 offers none of these). Invalid values are reported once and replaced by
 * their defaults.
 */
import {
  DidChangeConfigurationNotification,
  MessageType,
  ShowMessageNotification,
  type Connection,
  type InitializeParams,
} from 'vscode-languageserver/node';
import { DEFAULT_SERVICE_SETTINGS, readSettings, type ServiceSettings } from '@dewmark/core/service';
import { SETTINGS_SECTION } from '@dewmark/protocol';

/** Per-document settings with change notification. */
export class Configuration {
  private pullSupported = false;
  private dynamicChange = false;
  /** Settings pushed by the client (or given at initialize), used when it cannot be asked. */
  private pushed: ServiceSettings = DEFAULT_SERVICE_SETTINGS;
  private readonly perUri = new Map<string, Promise<ServiceSettings>>();
  private readonly reported = new Set<string>();
  private readonly listeners: (() => void)[] = [];
  /** Bumped on every change, so caches keyed on it go stale. */
  generation = 0;

  constructor(private readonly connection: Connection) {}

  /** Reads the client's configuration capabilities and any initial settings. */
  initialize(params: InitializeParams): void {
    const ws = params.capabilities.workspace;
    this.pullSupported = ws?.configuration === true;
    this.dynamicChange = ws?.didChangeConfiguration?.dynamicRegistration === true;
    const init = params.initializationOptions as Record<string, unknown> | null | undefined;
    if (init && typeof init === 'object' && init[SETTINGS_SECTION] !== undefined) {
      this.pushed = this.read(init[SETTINGS_SECTION]);
    }
    this.connection.onDidChangeConfiguration((change) => {
      const settings = (change.settings ?? null) as Record<string, unknown> | null;
      if (settings && typeof settings === 'object' && settings[SETTINGS_SECTION] !== undefined) {
        this.pushed = this.read(settings[SETTINGS_SECTION]);
      }
      this.perUri.clear();
      this.generation++;
      for (const l of this.listeners) l();
    });
  }

  /** Registers for configuration changes once the client is initialized (when it allows dynamic registration). */
  initialized(): void {
    if (this.dynamicChange) {
      void this.connection.client
        .register(DidChangeConfigurationNotification.type, { section: SETTINGS_SECTION })
        .catch((err: unknown) => this.connection.console.warn(`could not register for configuration changes: ${String(err)}`));
    }
  }

  /** Calls `listener` after every settings change. */
  onDidChange(listener: () => void): void {
    this.listeners.push(listener);
  }

  /** The settings for one document (asked once per document until the next change). */
  get(uri: string): Promise<ServiceSettings> {
    if (!this.pullSupported) return Promise.resolve(this.pushed);
    let p = this.perUri.get(uri);
    if (!p) {
      p = this.connection.workspace
        .getConfiguration({ scopeUri: uri, section: SETTINGS_SECTION })
        .then(
          (raw: unknown) => (raw === null || raw === undefined ? this.pushed : this.read(raw)),
          (err: unknown) => {
            this.connection.console.warn(`workspace/configuration failed, using defaults: ${String(err)}`);
            return this.pushed;
          },
        );
      this.perUri.set(uri, p);
    }
    return p;
  }

  /** Forgets a closed document's settings. */
  forget(uri: string): void {
    this.perUri.delete(uri);
  }

  private read(raw: unknown): ServiceSettings {
    const { settings, problems } = readSettings(raw);
    for (const problem of problems) {
      if (this.reported.has(problem)) continue;
      this.reported.add(problem);
      // A notification (allowed even before the initialize result), and the log for later reading.
      void this.connection.sendNotification(ShowMessageNotification.type, { type: MessageType.Warning, message: `Dewmark settings: ${problem}` });
      this.connection.console.warn(`settings: ${problem}`);
    }
    return settings;
  }
}
