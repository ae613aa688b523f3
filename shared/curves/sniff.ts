// What an uploaded file is, from its bytes (not its name), and how to turn text bytes into a string.

export type SniffedKind = 'xlsx' | 'xls' | 'text' | 'binary' | 'empty';

const SNIFF_WINDOW = 64 * 1024;
// Share of control bytes above which a file is not text. Text exports have none but
// tab/CR/LF; a few stray form feeds or escape codes should not turn a file away.
const CONTROL_SHARE_LIMIT = 0.05;

function startsWith(bytes: Uint8Array, signature: readonly number[]): boolean {
  if (bytes.length < signature.length) return false;
  for (let index = 0; index < signature.length; index++) if (bytes[index] !== signature[index]) return false;
  return true;
}

// ZIP local file header "PK\x03\x04" (APPNOTE.TXT §4.3.7): xlsx is a ZIP package (ECMA-376 Part 2).
const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04] as const;
// OLE2 compound file signature (MS-CFB §2.2): legacy .xls workbooks.
const OLE_MAGIC = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1] as const;
const UTF8_BOM = [0xef, 0xbb, 0xbf] as const;
const UTF16LE_BOM = [0xff, 0xfe] as const;
const UTF16BE_BOM = [0xfe, 0xff] as const;

type Utf16Order = 'utf-16le' | 'utf-16be' | null;

// UTF-16 text without a byte-order mark: ASCII text has a zero in every other byte.
function guessUtf16(bytes: Uint8Array): Utf16Order {
  if (startsWith(bytes, UTF16LE_BOM)) return 'utf-16le';
  if (startsWith(bytes, UTF16BE_BOM)) return 'utf-16be';
  const length = Math.min(bytes.length, 4096) & ~1;
  if (length < 4) return null;
  let zeroEven = 0;
  let zeroOdd = 0;
  for (let index = 0; index < length; index += 2) {
    if (bytes[index] === 0) zeroEven++;
    if (bytes[index + 1] === 0) zeroOdd++;
  }
  const pairs = length / 2;
  if (zeroOdd >= 0.9 * pairs && zeroEven <= 0.02 * pairs) return 'utf-16le';
  if (zeroEven >= 0.9 * pairs && zeroOdd <= 0.02 * pairs) return 'utf-16be';
  return null;
}

function isWhitespaceByte(byte: number): boolean {
  return byte === 0x20 || byte === 0x09 || byte === 0x0a || byte === 0x0d || byte === 0x0b || byte === 0x0c;
}

/**
 * What a file is, judged from its first bytes: `xlsx` (ZIP magic), `xls` (OLE2 magic),
 * `empty` (no bytes, or only whitespace and a BOM), `binary` (NUL bytes, or more than 5 %
 * control bytes other than tab/CR/LF/FF/VT, in the first 64 KiB), otherwise `text`. Bytes
 * that are not valid UTF-8 still count as text: decodeText reads them as windows-1252.
 * UTF-16 with a BOM (or the every-other-byte-zero pattern of ASCII in UTF-16) is text.
 * Reference: PKWARE APPNOTE.TXT §4.3.7 (ZIP), [MS-CFB] §2.2 (OLE2), Unicode §23.8 (BOM).
 * Cost: O(min(n, 64 KiB)).
 * @example sniffBytes(new TextEncoder().encode('j,V\n0.2,0.65\n')) // 'text'
 */
export function sniffBytes(bytes: Uint8Array): SniffedKind {
  if (!(bytes instanceof Uint8Array)) throw new TypeError('sniffBytes: bytes must be a Uint8Array');
  if (bytes.length === 0) return 'empty';
  if (startsWith(bytes, ZIP_MAGIC)) return 'xlsx';
  if (startsWith(bytes, OLE_MAGIC)) return 'xls';
  const utf16 = guessUtf16(bytes);
  if (utf16 !== null) {
    const text = decodeText(bytes);
    return text.trim().length === 0 ? 'empty' : 'text';
  }
  let start = startsWith(bytes, UTF8_BOM) ? 3 : 0;
  const end = Math.min(bytes.length, SNIFF_WINDOW);
  let control = 0;
  let visible = 0;
  for (let index = start; index < end; index++) {
    const byte = bytes[index];
    if (byte === 0) return 'binary';
    if (isWhitespaceByte(byte)) continue;
    visible++;
    if (byte < 0x20 || byte === 0x7f) control++;
  }
  if (visible === 0) {
    // only whitespace in the window: look at the rest before calling it empty
    for (start = end; start < bytes.length; start++) if (!isWhitespaceByte(bytes[start])) return sniffBytes(bytes.subarray(start));
    return 'empty';
  }
  const scanned = end - (startsWith(bytes, UTF8_BOM) ? 3 : 0);
  return control > CONTROL_SHARE_LIMIT * scanned ? 'binary' : 'text';
}

// windows-1252 bytes 0x80–0x9F (WHATWG Encoding Standard, index-windows-1252); the five
// unassigned bytes map to the C1 control of the same number, as WHATWG specifies.
const WINDOWS_1252_HIGH = [
  0x20ac, 0x81, 0x201a, 0x192, 0x201e, 0x2026, 0x2020, 0x2021, 0x2c6, 0x2030, 0x160, 0x2039, 0x152, 0x8d, 0x17d, 0x8f,
  0x90, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x2dc, 0x2122, 0x161, 0x203a, 0x153, 0x9d, 0x17e, 0x178,
] as const;

// Decoded by hand rather than with TextDecoder('windows-1252'): some runtimes (Node 20
// among them) decode that label as ISO-8859-1, turning 0x80 into U+0080 instead of €.
function decodeWindows1252(bytes: Uint8Array): string {
  const parts: string[] = [];
  const step = 8192;
  const codes = new Array<number>(step);
  for (let offset = 0; offset < bytes.length; offset += step) {
    const end = Math.min(bytes.length, offset + step);
    codes.length = end - offset;
    for (let index = offset; index < end; index++) {
      const byte = bytes[index];
      codes[index - offset] = byte >= 0x80 && byte <= 0x9f ? WINDOWS_1252_HIGH[byte - 0x80] : byte;
    }
    parts.push(String.fromCharCode(...codes));
  }
  return parts.join('');
}

/**
 * Text bytes → string: UTF-8 via TextDecoder (BOM dropped); UTF-16 LE/BE when a BOM or the
 * UTF-16 byte pattern says so; otherwise, when the bytes are not valid UTF-8, windows-1252
 * (the WHATWG reading of "latin1", which older station PCs write: `°`, `µ`, `²` as single
 * bytes), decoded from its table because not every runtime's TextDecoder has it right.
 * Reference: WHATWG Encoding Standard (TextDecoder; index-windows-1252). Cost: O(n).
 * @throws TypeError when bytes is not a Uint8Array.
 * @example decodeText(Uint8Array.of(0x54, 0xb0, 0x43)) // 'T°C'
 */
export function decodeText(bytes: Uint8Array): string {
  if (!(bytes instanceof Uint8Array)) throw new TypeError('decodeText: bytes must be a Uint8Array');
  if (bytes.length === 0) return '';
  if (startsWith(bytes, UTF8_BOM)) return new TextDecoder('utf-8').decode(bytes.subarray(3));
  const utf16 = guessUtf16(bytes);
  if (utf16 !== null) {
    const hasBom = startsWith(bytes, UTF16LE_BOM) || startsWith(bytes, UTF16BE_BOM);
    return new TextDecoder(utf16).decode(hasBom ? bytes.subarray(2) : bytes);
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return decodeWindows1252(bytes);
  }
}

/** A decoder for text arriving in chunks, chosen once from the file's first bytes. */
export interface ChunkDecoder {
  encoding: 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';
  /** decode the next chunk; call once more with no bytes (or stream: false) at the end */
  decode(bytes?: Uint8Array, options?: { stream?: boolean }): string;
}

/**
 * Streaming counterpart of decodeText: picks the encoding from the first bytes of the file
 * (UTF-8 or UTF-16 by BOM or byte pattern; windows-1252 when the head is not valid UTF-8)
 * and decodes chunk by chunk, carrying split multi-byte characters across chunks.
 * Reference: WHATWG Encoding Standard (TextDecoder streaming; index-windows-1252).
 * Cost: O(n) over all chunks.
 * @throws TypeError when head is not a Uint8Array.
 * @example const decoder = createChunkDecoder(head); parser.push(decoder.decode(chunk, { stream: true }))
 */
export function createChunkDecoder(head: Uint8Array): ChunkDecoder {
  if (!(head instanceof Uint8Array)) throw new TypeError('createChunkDecoder: head must be a Uint8Array');
  const utf16 = startsWith(head, UTF8_BOM) ? null : guessUtf16(head);
  if (utf16 !== null) {
    const decoder = new TextDecoder(utf16);
    return { encoding: utf16, decode: (bytes, options) => decoder.decode(bytes ?? new Uint8Array(0), { stream: options?.stream ?? false }) };
  }
  let validUtf8 = true;
  try {
    // a head cut inside a multi-byte character is still UTF-8: decode it in stream mode
    new TextDecoder('utf-8', { fatal: true }).decode(head, { stream: true });
  } catch {
    validUtf8 = false;
  }
  if (validUtf8) {
    const decoder = new TextDecoder('utf-8');
    return { encoding: 'utf-8', decode: (bytes, options) => decoder.decode(bytes ?? new Uint8Array(0), { stream: options?.stream ?? false }) };
  }
  return { encoding: 'windows-1252', decode: (bytes) => (bytes === undefined ? '' : decodeWindows1252(bytes)) };
}
