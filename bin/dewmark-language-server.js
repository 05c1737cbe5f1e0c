#!/usr/bin/env node
// The Dewmark language server. Start it from an editor with --stdio (or --node-ipc from VS Code).
'use strict';
const { existsSync } = require('node:fs');
const { join } = require('node:path');

const bundle = join(__dirname, '..', 'dist', 'server.js');
if (!existsSync(bundle)) {
  process.stderr.write(
    `dewmark-language-server: ${bundle} is missing; run "npm run build" in the Dewmark folder first.\n`,
  );
  process.exit(1);
}
require(bundle);
