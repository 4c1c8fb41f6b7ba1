#!/usr/bin/env node
// Runs a TypeScript file of this project (e.g. the benchmark) through tsx.
import { register } from 'tsx/esm/api';
import { pathToFileURL } from 'node:url';
import { resolve } from 'node:path';

register();
const [file, ...rest] = process.argv.slice(2);
if (!file) {
  process.stderr.write('usage: run-ts <file.ts> [args]\n');
  process.exit(2);
}
process.argv = [process.argv[0], file, ...rest];
await import(pathToFileURL(resolve(file)).href);
