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
// From the code cache the build made, when it belongs to this bundle (see run-bundle.js).
require('./run-bundle.js').runBundle(bundle, module);
