#!/usr/bin/env node
// The kinsort command line; the code lives in the built package (npm run build → dist/).
'use strict';
process.exitCode = require('../dist/cli/main.js').run(process.argv.slice(2));
