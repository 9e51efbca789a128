#!/usr/bin/env node
import './zod-setup.js';

// Loaded after zod's configuration: bundled, the schemas are built when their chunk is evaluated.
const { main } = await import('./main.js');
process.exitCode = await main(process.argv.slice(2));
