#!/usr/bin/env node
// The npm bin: the bundled checker, exporter and language server in one file.
require('../dist/waveplan.js');
