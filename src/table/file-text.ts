// Reading a text file with bounds: only regular files (a FIFO, /dev/zero or a folder is refused
// up front instead of blocking or reading forever), and never more than a stated number of bytes.
import * as fs from 'fs';
import { KinsortError } from '../core/errors';

/** Largest file read as text: a little under the longest string node can hold. */
export const MAX_TEXT_FILE_BYTES = 500 * 1024 * 1024;

function kindOf(stat: fs.Stats): string {
  if (stat.isDirectory()) return 'a folder';
  if (stat.isFIFO()) return 'a named pipe (FIFO)';
  if (stat.isCharacterDevice()) return 'a character device';
  if (stat.isBlockDevice()) return 'a block device';
  if (stat.isSocket()) return 'a socket';
  return 'not a regular file';
}

function tooLarge(opening: string, path: string, maxBytes: number): KinsortError {
  return new KinsortError(
    `${opening} "${path}": it is larger than ${maxBytes.toLocaleString('en-US')} bytes, the most kinsort reads as text; ` +
      'split it, or score it in the database (kinsort sql).',
    'too-large',
  );
}

/**
 * The UTF-8 text of a regular file, refusing anything else and anything above `maxBytes`.
 * `opening` starts every message, e.g. 'Cannot read CSV file' → `Cannot read CSV file "x": …`.
 */
export function readRegularTextFile(path: string, opening: string, maxBytes = MAX_TEXT_FILE_BYTES): string {
  return readRegularFileBytes(path, opening, maxBytes).toString('utf8');
}

/** The bytes of a regular file, with the same refusals as readRegularTextFile (for callers that decode). */
export function readRegularFileBytes(path: string, opening: string, maxBytes = MAX_TEXT_FILE_BYTES): Buffer {
  let fd: number;
  try {
    // Non-blocking open, so opening a FIFO with no writer returns at once; fstat then refuses it.
    fd = fs.openSync(path, fs.constants.O_RDONLY | fs.constants.O_NONBLOCK);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why =
      code === 'ENOENT'
        ? 'no such file'
        : code === 'EACCES'
          ? 'permission denied'
          : code === 'EISDIR'
            ? 'it is a folder'
            : (e as Error).message;
    throw new KinsortError(`${opening} "${path}": ${why}${code ? ` (${code})` : ''}.`, 'bad-input');
  }
  try {
    const stat = fs.fstatSync(fd);
    if (!stat.isFile()) throw new KinsortError(`${opening} "${path}": it is ${kindOf(stat)}; give a regular file.`, 'bad-input');
    if (stat.size > maxBytes) throw tooLarge(opening, path, maxBytes);
    // Read to the end, not to the stated size: some files (under /proc) report size 0, and a file
    // may grow while read; the bound holds either way.
    const chunks: Buffer[] = [];
    let total = 0;
    const chunk = Buffer.allocUnsafe(1 << 20);
    for (;;) {
      const got = fs.readSync(fd, chunk, 0, chunk.length, null);
      if (got === 0) break;
      total += got;
      if (total > maxBytes) throw tooLarge(opening, path, maxBytes);
      chunks.push(Buffer.from(chunk.subarray(0, got)));
    }
    return Buffer.concat(chunks, total);
  } catch (e) {
    if (e instanceof KinsortError) throw e;
    throw new KinsortError(`${opening} "${path}": ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}.`, 'bad-input');
  } finally {
    fs.closeSync(fd);
  }
}
