/**
 * What the nearest project file means for one local note beyond its settings: the name it is
 * shown by (its path relative to the workspace folder that holds it, so a hover says
 * `calcs/dewmark.json: pressure 84 kPa`), and whether its `include`/`exclude` patterns leave the
 * note out — decided by `@dewmark/files`, the same answer `dewmark check` gets.
 */
import { isAbsolute, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { projectFilter } from '@dewmark/files';
import { projectSources, type ProjectConfig, type ServiceSettings } from '@dewmark/core/service';

/** A project file's path relative to the workspace folder holding it (`/`-separated), else as it is. */
export function projectLabel(path: string, folders: readonly string[]): string {
  let best: string | undefined;
  for (const uri of folders) {
    let dir: string;
    try {
      dir = fileURLToPath(uri);
    } catch {
      continue; // not a local folder
    }
    const rel = relative(dir, path);
    if (rel === '' || rel === '..' || rel.startsWith(`..${sep}`) || isAbsolute(rel)) continue;
    if (best === undefined || rel.length < best.length) best = rel; // the innermost folder holding it
  }
  return best === undefined ? path : best.split(sep).join('/');
}

/**
 * The settings fields `project` decides for the note at `uri`: where its values came from, and whether it is left out.
 */
export function projectScope(
  project: ProjectConfig,
  uri: string,
  folders: readonly string[],
): Pick<ServiceSettings, 'sources' | 'excludedBy'> {
  const file = projectLabel(project.path, folders);
  const out: Pick<ServiceSettings, 'sources' | 'excludedBy'> = {};
  const sources = projectSources(project, file);
  if (sources) out.sources = sources;
  let abs: string | undefined;
  try {
    abs = fileURLToPath(uri);
  } catch {
    abs = undefined; // not a local note: no project file applies to it anyway
  }
  const left = abs === undefined ? null : projectFilter(project)(abs);
  if (left) out.excludedBy = { file, why: left.why };
  return out;
}
