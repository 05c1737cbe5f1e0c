/**
 * A project file's include/exclude patterns for one note (`projectFilter`): the answer the
 * command line and the language server share. Paths are built, never read: nothing is on disk.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { projectFilter } from '../src';

const top = join('/', 'work', 'repo');
const at = (...parts: string[]) => join(top, ...parts);

describe('projectFilter', () => {
  it('checks every note when there are no patterns', () => {
    const f = projectFilter({ dir: top, include: [], exclude: [] });
    expect(f(at('a.md'))).toBeNull();
    expect(f(at('deep', 'er', 'b.md'))).toBeNull();
  });

  it('an exclude pattern leaves out the notes it matches, or whose folder below the file it matches', () => {
    const f = projectFilter({ dir: top, include: [], exclude: ['*.draft.md', 'archive', 'old/**'] });
    expect(f(at('calcs', 'x.draft.md'))).toEqual({
      by: 'exclude',
      patterns: ['*.draft.md'],
      why: 'its exclude pattern "*.draft.md" matches it',
    });
    expect(f(at('calcs', 'archive', '2019', 'a.md'))?.patterns).toEqual(['archive']);
    expect(f(at('old', 'a.md'))?.patterns).toEqual(['old/**']);
    expect(f(at('calcs', 'archive.md'))).toBeNull();
    expect(f(at('calcs', 'a.md'))).toBeNull();
  });

  it('with include patterns, only the notes they match (or a folder of theirs) are checked; exclude still wins', () => {
    const f = projectFilter({ dir: top, include: ['calcs', 'plant/*.md'], exclude: ['calcs/tmp/**'] });
    expect(f(at('calcs', 'sub', 'a.md'))).toBeNull();
    expect(f(at('plant', 'ahu.md'))).toBeNull();
    expect(f(at('plant', 'x', 'ahu.md'))).toEqual({
      by: 'include',
      patterns: ['calcs', 'plant/*.md'],
      why: 'none of its include patterns "calcs", "plant/*.md" matches it',
    });
    expect(f(at('calcs', 'tmp', 'a.md'))?.by).toBe('exclude');
    expect(projectFilter({ dir: top, include: ['calcs/**'], exclude: [] })(at('b.md'))?.why).toBe(
      'its include pattern "calcs/**" does not match it',
    );
  });

  it('the folders above the project file are not matched (patterns are relative to its folder)', () => {
    const f = projectFilter({ dir: at('archive'), include: [], exclude: ['archive'] });
    expect(f(at('archive', 'a.md'))).toBeNull();
  });
});
