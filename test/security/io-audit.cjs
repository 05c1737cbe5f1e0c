'use strict';
/**
 * A `node --require` preload for the security tests: records every attempt of the process (and of
 * its worker threads) to open a network connection or listen, resolve a host name, write, create,
 * move or delete a file, or start another program, as one line `[io-audit] {"kind","call","target"}`
 * on standard error (written with the original fs.writeSync, so it is never itself recorded).
 * The calls still go ahead: the process behaves as it would without the preload. Reads are not
 * recorded (opening a file read-only is allowed).
 */
const fs = require('node:fs');
const net = require('node:net');
const http = require('node:http');
const https = require('node:https');
const http2 = require('node:http2');
const tls = require('node:tls');
const dgram = require('node:dgram');
const dns = require('node:dns');
const childProcess = require('node:child_process');

const writeSync = fs.writeSync;
const { O_WRONLY, O_RDWR, O_CREAT, O_TRUNC, O_APPEND } = fs.constants;

function record(kind, call, target) {
  let shown;
  try {
    shown = typeof target === 'string' ? target : target instanceof URL ? target.href : JSON.stringify(target);
  } catch {
    shown = String(target);
  }
  try {
    writeSync(2, `[io-audit] ${JSON.stringify({ kind, call, target: String(shown).slice(0, 300) })}\n`);
  } catch {
    // standard error closed: nothing to report to
  }
}

/** True when open() flags allow writing or creating. */
function writes(flags) {
  if (flags === undefined || flags === null) return false;
  if (typeof flags === 'number') return (flags & (O_WRONLY | O_RDWR | O_CREAT | O_TRUNC | O_APPEND)) !== 0;
  return /[wax+]/.test(String(flags));
}

function wrap(obj, name, kind, when = () => true) {
  const orig = obj && obj[name];
  if (typeof orig !== 'function') return;
  const wrapped = function (...args) {
    if (when(args)) record(kind, name, args[0]);
    return orig.apply(this, args);
  };
  Object.defineProperty(wrapped, 'name', { value: orig.name });
  obj[name] = wrapped;
}

// Files: writing, creating, changing, deleting.
const fileWrites = [
  'writeFile', 'writeFileSync', 'appendFile', 'appendFileSync', 'createWriteStream',
  'mkdir', 'mkdirSync', 'mkdtemp', 'mkdtempSync',
  'rm', 'rmSync', 'rmdir', 'rmdirSync', 'unlink', 'unlinkSync', 'rename', 'renameSync',
  'copyFile', 'copyFileSync', 'cp', 'cpSync',
  'symlink', 'symlinkSync', 'link', 'linkSync', 'truncate', 'truncateSync',
  'chmod', 'chmodSync', 'chown', 'chownSync', 'utimes', 'utimesSync',
];
for (const name of fileWrites) wrap(fs, name, 'file');
const promiseWrites = [
  'writeFile', 'appendFile', 'mkdir', 'mkdtemp', 'rm', 'rmdir', 'unlink', 'rename',
  'copyFile', 'cp', 'symlink', 'link', 'truncate', 'chmod', 'chown', 'utimes',
];
for (const name of promiseWrites) wrap(fs.promises, name, 'file');
wrap(fs, 'open', 'file', (a) => writes(a[1]));
wrap(fs, 'openSync', 'file', (a) => writes(a[1]));
wrap(fs.promises, 'open', 'file', (a) => writes(a[1]));

// Network: outgoing connections, listening, name lookups, HTTP(S), datagrams, fetch.
wrap(net.Socket.prototype, 'connect', 'network');
wrap(net, 'connect', 'network');
wrap(net, 'createConnection', 'network');
wrap(net.Server.prototype, 'listen', 'network');
wrap(tls, 'connect', 'network');
for (const mod of [http, https]) {
  wrap(mod, 'request', 'network');
  wrap(mod, 'get', 'network');
}
wrap(http2, 'connect', 'network');
wrap(dgram, 'createSocket', 'network');
for (const name of ['lookup', 'resolve', 'resolve4', 'resolve6', 'resolveAny']) wrap(dns, name, 'network');
if (typeof globalThis.fetch === 'function') wrap(globalThis, 'fetch', 'network');

// Other programs.
for (const name of ['spawn', 'spawnSync', 'exec', 'execSync', 'execFile', 'execFileSync', 'fork']) {
  wrap(childProcess, name, 'process');
}

// Tells the test that the preload is in place in this process.
try {
  writeSync(2, `[io-audit-ready] ${process.pid}\n`);
} catch {
  // standard error closed
}
