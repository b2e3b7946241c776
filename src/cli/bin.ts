#!/usr/bin/env node
import { run } from './run.js';
import { processIo } from './io.js';

// The one place the process exits: every command returns its code to here.
const code = await run(process.argv.slice(2), processIo());
process.exitCode = code;
