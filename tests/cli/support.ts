/**
 * Shared pieces of the CLI tests: an in-memory `CliIo` (files to read,
 * standard input, what the command printed and wrote), the demo survey file
 * as `lampwalk demo` prints it, and the installed command run as a real
 * process.
 */
import { execFile } from 'node:child_process';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { expect } from 'vitest';
import { main, type CliIo } from '../../src/cli/main.ts';

/** A `CliIo` that keeps everything in memory. */
export interface FakeIo extends CliIo {
  /** Everything printed on standard output. */
  out: string;
  /** Everything printed on standard error. */
  err: string;
  /** Files written, by path. */
  written: Map<string, Uint8Array>;
  /** A written file as UTF-8 text (undefined when the path was not written). */
  writtenText(path: string): string | undefined;
}

/**
 * An in-memory `CliIo` reading `files` (a missing path fails as ENOENT does)
 * and `stdin` (by default the file named "-").
 *
 * @example const io = fakeIo({ 'demo.json': text }); await main(['calc', 'demo.json'], io); io.out //=> the printed JSON
 */
export function fakeIo(files: Record<string, string> = {}, stdin = files['-'] ?? ''): FakeIo {
  const io: FakeIo = {
    out: '',
    err: '',
    written: new Map<string, Uint8Array>(),
    writtenText(path) {
      const bytes = io.written.get(path);
      return bytes === undefined ? undefined : new TextDecoder().decode(bytes);
    },
    stdout(text) {
      io.out += text;
    },
    stderr(text) {
      io.err += text;
    },
    async readFile(path) {
      const text = files[path];
      if (text === undefined) throw Object.assign(new Error('missing'), { code: 'ENOENT' });
      return text;
    },
    async readStdin() {
      return stdin;
    },
    async writeFile(path, bytes) {
      io.written.set(path, bytes);
    },
  };
  return io;
}

/** The survey file `lampwalk demo` prints (with `options`, e.g. `--portfolio`); the command must exit 0. */
export async function demoFileText(...options: string[]): Promise<string> {
  const io = fakeIo();
  expect(await main(['demo', ...options], io)).toBe(0);
  return io.out;
}

const execFileAsync = promisify(execFile);

/** The installed command's script. */
export const lampwalkBin = join(process.cwd(), 'bin', 'lampwalk.mjs');

/** Runs the installed command in its own Node process; rejects when it exits with a code other than 0. */
export function runLampwalk(args: string[]): Promise<{ stdout: string; stderr: string }> {
  return execFileAsync(process.execPath, [lampwalkBin, ...args]);
}

/** Runs the installed command expecting it to fail: its exit code and standard error, or null when it succeeded. */
export function runLampwalkFailure(args: string[]): Promise<{ code: number; stderr: string } | null> {
  return runLampwalk(args).then(
    () => null,
    (err: { code: number; stderr: string }) => err,
  );
}
