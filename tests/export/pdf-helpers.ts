/**
 * Reading PDFs back for the export tests with poppler's `pdftotext` and
 * rendering pages with `pdftoppm` (both from Debian's poppler-utils, which
 * `.ci/run` installs).
 */
import { execFile } from 'node:child_process';
import { mkdir, mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { deflateSync } from 'node:zlib';
import { pdfSafeText } from '../../src/export/text.ts';

const run = promisify(execFile);

/** The text of a PDF as `pdftotext` extracts it (reading order, not layout). */
export async function pdfText(bytes: Uint8Array): Promise<string> {
  const dir = await mkdtemp(join(tmpdir(), 'lampwalk-pdf-'));
  const file = join(dir, 'doc.pdf');
  await writeFile(file, bytes);
  const { stdout } = await run('pdftotext', ['-enc', 'UTF-8', file, '-'], { maxBuffer: 64 * 1024 * 1024 });
  return stdout;
}

/** Page count as `pdfinfo`… via the form feeds pdftotext writes between pages. */
export function pageCount(text: string): number {
  return text.split('\f').filter((page, i, all) => i < all.length - 1 || page.trim() !== '').length;
}

/** All runs of white space (including no-break spaces) as one plain space. */
export function squash(text: string): string {
  return text.replace(/[\s\u00a0\u202f]+/g, ' ').trim();
}

/** Text without any white space: pdftotext sometimes drops a space between narrow glyphs ("1 €" → "1€"). */
export function compact(text: string): string {
  return text.replace(/[\s\u00a0\u202f]+/g, '');
}

/** True when `text` contains `expected` as the PDF prints it (made safe; white space ignored). */
export function printed(text: string, expected: string): boolean {
  return compact(text).includes(compact(pdfSafeText(expected)));
}

/** Renders every page to PNG under test-artifacts/ for a person to look at; returns the folder. */
export async function renderPages(bytes: Uint8Array, name: string): Promise<string> {
  const dir = join(process.cwd(), 'test-artifacts', 'export');
  await mkdir(dir, { recursive: true });
  const file = join(dir, `${name}.pdf`);
  await writeFile(file, bytes);
  await run('pdftoppm', ['-r', '80', '-png', file, join(dir, name)]);
  return dir;
}

function crc32(bytes: Uint8Array): number {
  let crc = 0xffffffff;
  for (const byte of bytes) {
    crc ^= byte;
    for (let k = 0; k < 8; k++) crc = crc & 1 ? (crc >>> 1) ^ 0xedb88320 : crc >>> 1;
  }
  return (crc ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Uint8Array): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A small RGB PNG (a two-colour diagonal), as a data URL, for logo and photo tests. */
export function pngDataUrl(width: number, height: number, a: [number, number, number], b: [number, number, number]): string {
  const rows: number[] = [];
  for (let y = 0; y < height; y++) {
    rows.push(0);
    for (let x = 0; x < width; x++) rows.push(...(x / width + y / height < 1 ? a : b));
  }
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 8; // bit depth
  header[9] = 2; // RGB
  const png = Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(Buffer.from(rows))),
    chunk('IEND', new Uint8Array()),
  ]);
  return `data:image/png;base64,${png.toString('base64')}`;
}
