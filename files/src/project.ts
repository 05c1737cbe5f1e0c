/**
 * What a project file's `include` and `exclude` patterns decide for one note — the one answer for
 * `dewmark check` and the language server (its Check All and its open notes). Patterns are
 * written relative to the project file's folder; a bare name matches at any depth (as `--exclude`
 * does). A pattern that matches a folder between the project file and the note matches the note
 * too, so `"archive"` leaves out every note under an `archive/` folder, like `"archive/**"`.
 */
import { dirname, relative, sep } from 'node:path';
import { patternMatcher } from './select';

/** The patterns of one project file, and the folder they are relative to. */
export interface ProjectPatterns {
  /** The project file's folder. */
  dir: string;
  /** Notes to check (empty: every note). */
  include: readonly string[];
  /** Notes never checked. */
  exclude: readonly string[];
}

/** Why a project file leaves a note out: the pattern (or patterns) that decided it. */
export interface LeftOutByProject {
  /** `exclude` when an exclude pattern matches, `include` when no include pattern does. */
  by: 'include' | 'exclude';
  /** The exclude pattern that matched, or every include pattern (none matched). */
  patterns: string[];
  /** One phrase for messages: `its exclude pattern "archive/**" matches it`. */
  why: string;
}

/**
 * A function that tells, for an absolute note path below `p.dir`, whether the project file leaves
 * it out (and why), or null when the note is checked. Each pattern is compiled once.
 */
export function projectFilter(p: ProjectPatterns): (abs: string) => LeftOutByProject | null {
  const exclude = p.exclude.map((pattern) => ({ pattern, matches: patternMatcher([pattern], p.dir) }));
  const include = p.include.length > 0 ? patternMatcher(p.include, p.dir) : null;
  return (abs) => {
    const chain = pathsFrom(p.dir, abs);
    for (const e of exclude) {
      if (chain.some(e.matches))
        return {
          by: 'exclude',
          patterns: [e.pattern],
          why: `its exclude pattern ${JSON.stringify(e.pattern)} matches it`,
        };
    }
    if (include && !chain.some(include)) {
      const list = p.include.map((x) => JSON.stringify(x)).join(', ');
      return {
        by: 'include',
        patterns: [...p.include],
        why:
          p.include.length === 1
            ? `its include pattern ${list} does not match it`
            : `none of its include patterns ${list} matches it`,
      };
    }
    return null;
  };
}

/** `abs`, then each folder above it up to (not including) `top`; just `abs` when it is not below `top`. */
function pathsFrom(top: string, abs: string): string[] {
  const out = [abs];
  const rel = relative(top, abs);
  if (rel === '' || rel.startsWith(`..${sep}`) || rel === '..') return out;
  let cur = dirname(abs);
  for (let depth = rel.split(sep).length - 1; depth > 0; depth--) {
    out.push(cur);
    cur = dirname(cur);
  }
  return out;
}
