/**
 * How the server finds the project file `dewmark.json` of an open note: the Node server reads the
 * disk above a local note (./nodeHost), the web build asks its client to read through the editor's
 * file system (./clientProjectFiles). The settings code (./configuration) sees only this.
 */
import type { ProjectConfig, ServiceSettings } from '@dewmark/core/service';

/** The project files a host can read. */
export interface ProjectFiles {
  /** The nearest project file at or above the note `uri`, or null (none, or none this host can read). */
  find(uri: string): ProjectConfig | null | Promise<ProjectConfig | null>;
  /**
   * What `project` decides for the note at `uri` beyond its settings: where its values came from
   * (named relative to the workspace folders, for hovers), and whether its include/exclude leave
   * the note out.
   */
  scope(
    project: ProjectConfig,
    uri: string,
    folders: readonly string[],
  ): Pick<ServiceSettings, 'sources' | 'excludedBy'>;
  /** Forgets the file texts read so far (a project file or the settings changed). */
  clear(): void;
}
