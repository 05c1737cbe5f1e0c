/**
 * The part of picomatch 4 (a dependency of this package, without bundled types) that
 * `select.ts` uses: compiling a glob to a matcher, and splitting a glob into its static base and
 * the rest. See picomatch's README for the full API.
 */
declare module 'picomatch' {
  interface PicomatchOptions {
    /** Let `*` and `**` match names that start with a dot. */
    dot?: boolean;
    /** Match a pattern without slashes against the last segment of a path. */
    basename?: boolean;
    /** Treat the input as a Windows path. */
    windows?: boolean;
  }
  interface ScanResult {
    /** The leading part of the pattern that has no glob characters (`docs` in `docs/**\/*.md`). */
    base: string;
    /** The rest of the pattern. */
    glob: string;
    /** Whether the pattern has glob characters at all. */
    isGlob: boolean;
  }
  function picomatch(glob: string | string[], options?: PicomatchOptions): (path: string) => boolean;
  namespace picomatch {
    function scan(input: string, options?: PicomatchOptions): ScanResult;
  }
  export = picomatch;
}
