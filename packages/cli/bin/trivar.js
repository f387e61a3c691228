#!/usr/bin/env node
// CommonJS (bin/package.json): see dist/trivar.js, built from src/loader/runBundle.ts.
require('../dist/trivar.js');
