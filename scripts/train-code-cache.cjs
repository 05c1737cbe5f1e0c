// Run by the build (build.mjs): runs the CLI bundle named by DEWMARK_TRAIN_BUNDLE with this
// process's arguments (a command on the example notes), and when it exits writes V8's code cache
// of everything that run compiled to DEWMARK_CODE_CACHE_OUT (see bin/run-bundle.js).
'use strict';
const { runBundle } = require('../bin/run-bundle.js');

runBundle(process.env.DEWMARK_TRAIN_BUNDLE, module, process.env.DEWMARK_CODE_CACHE_OUT);
