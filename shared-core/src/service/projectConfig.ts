/**
 * The project file `dewmark.json`: one configuration for the editor and CI. The nearest one above
 * a note (its folder, then each parent) applies to it; the CLI and the language server both read
 * it through {@link findProjectConfig}, with their own file reading passed in (the core does no
 * I/O). Its keys are the editor settings' (without `dewmark.`) plus `include`, `exclude` and
 * `rules`; the JSON schema `schema/dewmark.schema.json` describes the same keys for editors.
 *
 * Precedence: the project file wins over editor settings, which fill only what it leaves open;
 * on the command line, options given explicitly win over the project file.
 */

import { readSettings } from './settings';
import type { ServiceSettings, SourcedSetting } from './types';

/** The project file's name. */
export const PROJECT_FILE = 'dewmark.json';

/** Keys that are editor settings too (same names, same values as `dewmark.*`). */
export const SETTING_KEYS = ['units', 'pressure', 'elevation', 'checkClaims', 'precision', 'inlayHints'] as const;

/** Every top-level key the project file accepts. */
export const PROJECT_KEYS = ['$schema', ...SETTING_KEYS, 'include', 'exclude', 'rules'] as const;

/** A project file, read and checked. */
export interface ProjectConfig {
  /** The file's path as the caller gave it. */
  path: string;
  /** The folder `include` and `exclude` patterns are relative to. */
  dir: string;
  /**
   * The editor-setting keys it sets and its `rules`, in the shape of the `dewmark` settings section
   * (read by `readSettings`).
   */
  section: Record<string, unknown>;
  /** Glob patterns of notes to check (empty: every note). */
  include: string[];
  /** Glob patterns of notes never checked. */
  exclude: string[];
  /** What is wrong in the file, each naming the key and how to write it; the rest still applies. */
  problems: string[];
}

function stringList(value: unknown, key: string, problems: string[]): string[] {
  if (value === undefined) return [];
  if (!Array.isArray(value) || !value.every((v) => typeof v === 'string' && v.trim() !== '')) {
    problems.push(
      `"${key}" must be a list of glob patterns such as ["calcs/**/*.md"], not ${JSON.stringify(value)}; it is ignored`,
    );
    return [];
  }
  return value as string[];
}

/** Reads a project file's text. Never throws: a broken file is a config with one problem and nothing else. */
export function parseProjectConfig(text: string, path: string, dir: string): ProjectConfig {
  const config: ProjectConfig = { path, dir, section: {}, include: [], exclude: [], problems: [] };
  let raw: unknown;
  try {
    raw = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (err) {
    config.problems.push(
      `it is not valid JSON (${err instanceof Error ? err.message : String(err)}); ` +
        `fix it, or delete it to use the defaults`,
    );
    return config;
  }
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) {
    config.problems.push('it must hold one JSON object, e.g. { "units": "SI", "elevation": "1600 m" }');
    return config;
  }
  const obj = raw as Record<string, unknown>;
  for (const key of Object.keys(obj)) {
    if (!(PROJECT_KEYS as readonly string[]).includes(key))
      config.problems.push(
        `"${key}" is not a key of ${PROJECT_FILE}; the keys ` +
          `are ${PROJECT_KEYS.filter((k) => k !== '$schema').join(', ')}`,
      );
  }
  for (const key of SETTING_KEYS) if (obj[key] !== undefined) config.section[key] = obj[key];
  config.include = stringList(obj.include, 'include', config.problems);
  config.exclude = stringList(obj.exclude, 'exclude', config.problems);
  // Rules are read, like every setting, by readSettings (their problems come back from there).
  if (obj.rules !== undefined) config.section.rules = obj.rules;
  return config;
}

/**
 * The editor settings section with the project file's keys put over it: what the file sets wins,
 * the editor's fill the rest. A file that sets either `pressure` or `elevation` sets the site, so
 * the editor's other site key is dropped (an editor elevation would otherwise win over the file's
 * pressure).
 */
export function mergeSection(
  editor: Record<string, unknown> | null | undefined,
  config: ProjectConfig | null,
): Record<string, unknown> {
  const base: Record<string, unknown> = editor && typeof editor === 'object' ? { ...editor } : {};
  if (!config) return base;
  const own = config.section;
  if ('pressure' in own || 'elevation' in own) {
    delete base.pressure;
    delete base.elevation;
  }
  for (const [k, v] of Object.entries(own)) {
    if (
      k === 'inlayHints' &&
      v &&
      typeof v === 'object' &&
      !Array.isArray(v) &&
      base.inlayHints &&
      typeof base.inlayHints === 'object'
    ) {
      base.inlayHints = { ...(base.inlayHints as object), ...(v as object) };
    } else base[k] = v;
  }
  return base;
}

/**
 * The settings of a note under `config`: the editor's section (or none) with the project file's
 * keys over it, read and checked, and the source of each value the file set (`shown`: the file's
 * path as the user reads it). Problems are {@link readSettings}'s; the file's own are in
 * `config.problems`.
 */
export function readProjectSettings(
  editor: Record<string, unknown> | null | undefined,
  config: ProjectConfig | null,
  shown: string,
): { settings: ServiceSettings; problems: string[] } {
  const { settings, problems } = readSettings(mergeSection(editor, config));
  const sources = config ? projectSources(config, shown) : undefined;
  if (sources) settings.sources = sources;
  return { settings, problems };
}

/**
 * The settings `config` is the source of, each mapped to `shown` (the file's path as the user
 * reads it), or undefined when it sets none. Put into {@link ServiceSettings.sources}.
 */
export function projectSources(
  config: ProjectConfig,
  shown: string,
): Partial<Record<SourcedSetting, string>> | undefined {
  const sources: Partial<Record<SourcedSetting, string>> = {};
  for (const key of [...SETTING_KEYS, 'rules'] as const) {
    if (config.section[key] === undefined) continue;
    sources[key === 'pressure' || key === 'elevation' ? 'site' : key] = shown;
  }
  return Object.keys(sources).length > 0 ? sources : undefined;
}

/** How a caller reads files and walks folders (Node's fs and path, or a test's map). */
export interface ConfigFileSystem {
  /** The file's text, or null when there is none (or it cannot be read). */
  read(path: string): string | null;
  /** The parent folder, or the same folder at the root. */
  parent(dir: string): string;
  join(dir: string, name: string): string;
}

/** The nearest project file at or above `dir`, or null. Reads at most one file per folder up to the root. */
export function findProjectConfig(dir: string, fs: ConfigFileSystem): ProjectConfig | null {
  let cur = dir;
  for (let i = 0; i < 256; i++) {
    const path = fs.join(cur, PROJECT_FILE);
    const text = fs.read(path);
    if (text !== null) return parseProjectConfig(text, path, cur);
    const up = fs.parent(cur);
    if (up === cur) return null;
    cur = up;
  }
  return null;
}
