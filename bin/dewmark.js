#!/usr/bin/env node
// The dewmark command: runs the bundled CLI (build it with `npm run build`).
require('../dist/cli.js');
