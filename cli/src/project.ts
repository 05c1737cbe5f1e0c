/**
 * The project file `dewmark.json` on the command line: for each note, the nearest one above it
 * gives its settings (units, default site, claims, rules), and its `include` and `exclude`
 * patterns choose which found notes are checked. Options given on the command line win over it.
 * Each folder is looked at once, each project file read once.
 */
import { dirname, isAbsolute, relative, sep } from 'node:path';
import { cachedDiskFiles, projectFilter, type Input, type LeftOutByProject } from '@dewmark/files';
import {
  findProjectConfig,
  readProjectSettings,
  toEvaluateSettings,
  type ConfigFileSystem,
  type EvaluateSettings,
  type ProjectConfig,
} from './core';

/** What the project files decide for the inputs. */
export interface ProjectSelection {
  /** The inputs to check, each with its settings (command-line options over its project file). */
  tasks: { input: Input; settings: Partial<EvaluateSettings> }[];
  /** Inputs left out by a project file's include/exclude. */
  excluded: number;
  /** The first input left out, the project file (as shown) and why: for the message when nothing is left. */
  firstLeftOut?: { display: string; file: string; why: string };
  /** Problems of the project files, each naming the file (exit code 2). */
  problems: string[];
}

/** A path as the user reads it: relative to the working directory when below it. */
function displayPath(abs: string, cwd: string): string {
  const rel = relative(cwd, abs);
  const shown = rel === '' || rel.startsWith('..') || isAbsolute(rel) ? abs : rel;
  return sep === '\\' ? shown.replace(/\\/g, '/') : shown;
}

/** A project file's settings as evaluator settings (its problems are added to `problems`). */
function settingsOf(config: ProjectConfig, cwd: string, problems: string[]): Partial<EvaluateSettings> {
  const shown = displayPath(config.path, cwd);
  const { settings, problems: own } = readProjectSettings(null, config, shown);
  for (const p of [...config.problems, ...own]) problems.push(`${shown}: ${p.replace(/^dewmark\./, '')}`);
  return toEvaluateSettings(settings);
}

/**
 * Applies the project files to `inputs` (standard input takes the one above the working
 * directory). `cli` holds only the options given on the command line.
 */
export function selectWithProjects(inputs: Input[], cwd: string, cli: Partial<EvaluateSettings>): ProjectSelection {
  const fs: ConfigFileSystem = cachedDiskFiles();
  const byDir = new Map<string, ProjectConfig | null>();
  const perConfig = new Map<
    ProjectConfig,
    {
      settings: Partial<EvaluateSettings>;
      leftOut: (abs: string) => LeftOutByProject | null;
    }
  >();
  const problems: string[] = [];
  const out: ProjectSelection = { tasks: [], excluded: 0, problems };
  for (const input of inputs) {
    const dir = input.abs === null ? cwd : dirname(input.abs);
    let config = byDir.get(dir);
    if (config === undefined) {
      config = findProjectConfig(dir, fs);
      byDir.set(dir, config);
    }
    if (!config) {
      out.tasks.push({ input, settings: cli });
      continue;
    }
    let p = perConfig.get(config);
    if (!p) {
      p = {
        settings: settingsOf(config, cwd, problems),
        leftOut: projectFilter(config),
      };
      perConfig.set(config, p);
    }
    const left = input.abs === null ? null : p.leftOut(input.abs);
    if (left) {
      out.excluded++;
      out.firstLeftOut ??= { display: input.display, file: displayPath(config.path, cwd), why: left.why };
      continue;
    }
    out.tasks.push({ input, settings: { ...p.settings, ...cli } });
  }
  return out;
}
