// The one rule every `.save()` follows (views, pages, write-ups, definitions, command-line output):
// missing folders are created, and every failure is a KinsortError naming the path. Folders are
// made one level at a time because node's recursive mkdir never returns on some paths
// (`/proc/nope/x` loops forever on node 20).
import * as fs from 'fs';
import * as path from 'path';
import { KinsortError } from './errors';

function failure(file: string, what: string, e: unknown): KinsortError {
  const code = (e as NodeJS.ErrnoException).code;
  const why =
    code === 'EISDIR'
      ? 'it is a folder'
      : code === 'ENOTDIR'
        ? 'part of the path is a file, not a folder'
        : code === 'EACCES' || code === 'EPERM'
          ? 'permission denied'
          : code === 'ENOENT'
            ? 'the folder cannot be created there'
            : (e as Error).message;
  return new KinsortError(`cannot write ${what} to "${file}": ${why}${code ? ` (${code})` : ''}.`, 'bad-input');
}

/** Create `folder` and its missing parents, one level at a time (never loops). */
function makeFolders(folder: string): void {
  const missing: string[] = [];
  let at = folder;
  while (!fs.existsSync(at)) {
    missing.push(at);
    const parent = path.dirname(at);
    if (parent === at) break;
    at = parent;
  }
  for (const dir of missing.reverse()) fs.mkdirSync(dir);
}

/** Write `text` to `file` (UTF-8), creating missing folders; returns the absolute path. */
export function saveText(file: unknown, text: string, what = 'the file'): string {
  if (typeof file !== 'string' || file.trim() === '') {
    throw new KinsortError(
      `save: give a file path for ${what}; got ${typeof file === 'string' ? 'an empty string' : typeof file}.`,
      'bad-argument',
    );
  }
  if (file.includes('\u0000')) throw new KinsortError(`save: the path for ${what} holds a NUL character.`, 'bad-argument');
  const target = path.resolve(file);
  try {
    makeFolders(path.dirname(target));
    fs.writeFileSync(target, text, 'utf8');
  } catch (e) {
    throw failure(file, what, e);
  }
  return target;
}
