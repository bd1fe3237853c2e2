/** Reads an SVG file as text, refusing oversized files and invalid UTF-8 with a position. */
import { open } from 'node:fs/promises';
import { SvgReadError } from './xml-tree.js';
import { DEFAULT_LIMITS } from './parse-xml.js';

export async function readSvgText(path: string, maxBytes: number = DEFAULT_LIMITS.maxChars): Promise<string> {
  const handle = await open(path, 'r').catch((err: NodeJS.ErrnoException) => {
    throw new SvgReadError(`cannot open file: ${err.code ?? err.message}`, 1, 1, path);
  });
  try {
    const info = await handle.stat();
    if (!info.isFile()) throw new SvgReadError('not a regular file', 1, 1, path);
    if (info.size > maxBytes) {
      throw new SvgReadError(`file is larger than the ${maxBytes}-byte limit (${info.size} bytes)`, 1, 1, path);
    }
    const bytes = await handle.readFile();
    return decodeSvgBytes(bytes, path);
  } finally {
    await handle.close();
  }
}

/** UTF-8 (or UTF-16 with a byte-order mark) to text; invalid bytes are an error at their position. */
export function decodeSvgBytes(bytes: Uint8Array, file?: string): string {
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return new TextDecoder('utf-16le').decode(bytes.subarray(2));
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return new TextDecoder('utf-16be').decode(bytes.subarray(2));
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    const bad = firstInvalidUtf8(bytes);
    const prefix = new TextDecoder('utf-8').decode(bytes.subarray(0, bad));
    const lines = prefix.split('\n');
    const line = lines.length;
    const column = lines[lines.length - 1]!.length + 1;
    throw new SvgReadError(`invalid UTF-8 byte 0x${bytes[bad]?.toString(16).padStart(2, '0')} at byte ${bad}`, line, column, file);
  }
}

function firstInvalidUtf8(b: Uint8Array): number {
  let i = 0;
  while (i < b.length) {
    const c = b[i]!;
    let need = 0;
    let min = 0;
    if (c < 0x80) { i++; continue; }
    else if (c >= 0xc2 && c <= 0xdf) { need = 1; min = 0x80; }
    else if (c >= 0xe0 && c <= 0xef) { need = 2; min = 0x800; }
    else if (c >= 0xf0 && c <= 0xf4) { need = 3; min = 0x10000; }
    else return i;
    let cp = c & (0x3f >> need);
    for (let k = 1; k <= need; k++) {
      const d = b[i + k];
      if (d === undefined || (d & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (d & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += need + 1;
  }
  return b.length;
}
