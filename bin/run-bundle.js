// Runs a CommonJS bundle as `require` would, from V8's code cache when the build left one beside
// it. Every command begins by compiling the bundle (about 680 KB) and then, function by function,
// the code the command runs: the cache holds that compiled code, made by `npm run build` after a
// training run, so a command starts with it instead.
//
// The cache (`<bundle>.cache`) begins with a line naming the bundle it was made from: its size
// and modification time, checked with one `stat` (hashing the bundle would cost more than the
// cache saves). V8 itself refuses a cache made by another V8 version or with other flags. Any
// mismatch, and a missing or unreadable cache, runs the bundle as `require` does: the cache only
// saves time, it never changes what runs.
'use strict';
const fs = require('node:fs');
const Module = require('node:module');
const path = require('node:path');
const vm = require('node:vm');

/** The first line of every cache file, and the form of the second (the bundle's size and mtime). */
const MAGIC = 'dewmark-code-cache 1\n';

/** The line that ties a cache to one build of the bundle: `size mtimeNs`. */
function bundleStamp(bundle) {
  const st = fs.statSync(bundle, { bigint: true });
  return `${st.size} ${st.mtimeNs}\n`;
}

/**
 * The V8 code cache for `bundle` in `cacheFile`, or undefined when there is none, it cannot be
 * read, or it was made from another build of the bundle.
 */
function readCache(bundle, cacheFile) {
  let bytes;
  try {
    bytes = fs.readFileSync(cacheFile);
  } catch {
    return undefined;
  }
  const head = MAGIC + bundleStamp(bundle);
  if (bytes.length <= head.length || bytes.toString('latin1', 0, head.length) !== head) return undefined;
  return bytes.subarray(head.length);
}

/**
 * Runs `bundle` as a CommonJS module whose parent is `parent`. Uses `<bundle>.cache` when it
 * belongs to this build; with `writeCacheTo` set, writes a new cache there when the process
 * exits (what the build does after a training run). Returns whether a cache was used (for tests).
 */
function runBundle(bundle, parent, writeCacheTo) {
  const cachedData = writeCacheTo ? undefined : readCache(bundle, `${bundle}.cache`);
  if (cachedData === undefined && !writeCacheTo) {
    require(bundle);
    return false;
  }
  const source = fs.readFileSync(bundle, 'utf8');
  const script = new vm.Script(Module.wrap(source), { filename: bundle, cachedData });
  if (writeCacheTo) {
    // After the run, so that the cache holds every function the training run compiled.
    const stamp = bundleStamp(bundle);
    process.on('exit', () => {
      fs.writeFileSync(writeCacheTo, Buffer.concat([Buffer.from(MAGIC + stamp, 'latin1'), script.createCachedData()]));
    });
  }
  const mod = new Module(bundle, parent);
  mod.filename = bundle;
  mod.paths = Module._nodeModulePaths(path.dirname(bundle));
  Module._cache[bundle] = mod;
  script.runInThisContext()(mod.exports, Module.createRequire(bundle), mod, bundle, path.dirname(bundle));
  mod.loaded = true;
  return cachedData !== undefined && !script.cachedDataRejected;
}

module.exports = { runBundle };
