#!/usr/bin/env node
// Runs the TypeScript command line directly (no build step) through tsx.
import { register } from 'tsx/esm/api';

register();
// A closed pipe (`lampwalk schedule x.json | head`) ends the command quietly, not with a stack trace.
process.stdout.on('error', (err) => {
  if (err.code === 'EPIPE') process.exit(0);
  throw err;
});
const { main } = await import('../src/cli/main.ts');
process.exitCode = await main(process.argv.slice(2), {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  readFile: async (path) => (await import('node:fs/promises')).readFile(path, 'utf8'),
  writeFile: async (path, bytes) => (await import('node:fs/promises')).writeFile(path, bytes),
  readStdin: async () => {
    const chunks = [];
    for await (const chunk of process.stdin) chunks.push(chunk);
    return Buffer.concat(chunks).toString('utf8');
  },
});
