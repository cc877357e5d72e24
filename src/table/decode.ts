// Bytes of a CSV file → text. UTF-8 (with or without BOM) is read as is; anything that is not valid
// UTF-8 is refused naming the problem (never turned into U+FFFD, which would merge different names),
// unless the person names the encoding to decode with.
import { KinsortError } from '../core/errors';

function lineAt(bytes: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset && i < bytes.length; i++) if (bytes[i] === 10) line++;
  return line;
}

/** The offset of the first byte that breaks UTF-8, or -1. */
function firstBadUtf8(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const b = bytes[i];
    if (b < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let min: number;
    if (b >= 0xc2 && b <= 0xdf) [need, min] = [1, 0x80];
    else if (b >= 0xe0 && b <= 0xef) [need, min] = [2, 0x800];
    else if (b >= 0xf0 && b <= 0xf4) [need, min] = [3, 0x10000];
    else return i;
    let cp = b & (0xff >> (need + 2));
    for (let k = 1; k <= need; k++) {
      const c = bytes[i + k];
      if (c === undefined || (c & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (c & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += need + 1;
  }
  return -1;
}

/**
 * Decode a CSV file's bytes. `encoding` is any label TextDecoder knows ('latin1', 'windows-1252',
 * 'utf-16le', …); without it the bytes must be UTF-8.
 */
export function decodeCsvBytes(bytes: Uint8Array, source: string, encoding?: string): string {
  if (encoding !== undefined) {
    let decoder: TextDecoder;
    try {
      decoder = new TextDecoder(encoding, { fatal: true });
    } catch {
      throw new KinsortError(
        `${source}: encoding "${encoding}" is not one this runtime can decode (try "utf-8", "latin1", "windows-1252" or "utf-16le").`,
        'bad-option',
      );
    }
    try {
      return decoder.decode(bytes);
    } catch {
      throw new KinsortError(`${source}: the bytes are not valid ${encoding}.`, 'bad-input');
    }
  }
  if (bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))) {
    const which = bytes[0] === 0xff ? 'utf-16le' : 'utf-16be';
    throw new KinsortError(
      `${source} is UTF-16 text (it starts with a ${which.toUpperCase()} byte-order mark), not UTF-8. Save it as UTF-8, or name the encoding: { encoding: '${which}' } (--encoding ${which} on the command line).`,
      'bad-input',
    );
  }
  const nul = bytes.indexOf(0);
  if (nul >= 0) {
    throw new KinsortError(
      `${source} holds a zero byte at byte ${nul + 1} (line ${lineAt(bytes, nul)}): it is not UTF-8 text (UTF-16 without a byte-order mark, or a binary file). Save it as UTF-8, or name the encoding ({ encoding: 'utf-16le' }).`,
      'bad-input',
    );
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    // fall through: name the first byte that breaks it
  }
  const bad = Math.max(0, firstBadUtf8(bytes));
  throw new KinsortError(
    `${source} is not valid UTF-8: byte ${bad + 1} (0x${bytes[bad].toString(16).padStart(2, '0')}, line ${lineAt(bytes, bad)}) cannot start or continue a UTF-8 character. ` +
      `It is probably Latin-1 or Windows-1252 text; name the encoding to read it ({ encoding: 'windows-1252' }), or save the file as UTF-8.`,
    'bad-input',
  );
}
