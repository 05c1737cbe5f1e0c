#!/usr/bin/env node
// The dewmark command: runs the bundled CLI.
'use strict';
const { existsSync } = require('node:fs');
const { join } = require('node:path');

const bundle = join(__dirname, '..', 'dist', 'cli.js');
if (!existsSync(bundle)) {
  process.stderr.write(`dewmark: ${bundle} is missing; run "npm run build" in the Dewmark folder first.\n`);
  process.exit(2);
}
require(bundle);
