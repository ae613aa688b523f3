import { describe, it, expect } from 'vitest';
import { sniffBytes, decodeText, createChunkDecoder } from '../../../shared/curves/index';

const encode = (text: string): Uint8Array => new TextEncoder().encode(text);

describe('sniffBytes', () => {
  it('tells workbooks by their magic numbers', () => {
    expect(sniffBytes(Uint8Array.of(0x50, 0x4b, 0x03, 0x04, 0x14, 0x00))).toBe('xlsx'); // ZIP local header, PKWARE APPNOTE §4.3.7
    expect(sniffBytes(Uint8Array.of(0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0))).toBe('xls'); // OLE2 signature, [MS-CFB] §2.2
  });
  it('calls no bytes or only whitespace empty', () => {
    expect(sniffBytes(new Uint8Array(0))).toBe('empty');
    expect(sniffBytes(encode(' \r\n\t\n'))).toBe('empty');
    expect(sniffBytes(Uint8Array.of(0xef, 0xbb, 0xbf, 0x0a))).toBe('empty');
  });
  it('calls NUL bytes or many control bytes binary', () => {
    expect(sniffBytes(Uint8Array.of(0x6a, 0x2c, 0x00, 0x56))).toBe('binary');
    const noisy = encode('j,V\n0.1,0.8\n'.repeat(4));
    for (let index = 0; index < noisy.length; index += 4) noisy[index] = 0x01;
    expect(sniffBytes(noisy)).toBe('binary');
  });
  it('calls UTF-8, Latin-1 and UTF-16 text text', () => {
    expect(sniffBytes(encode('T (°C),U (V)\n180,0.6\n'))).toBe('text');
    expect(sniffBytes(Uint8Array.of(0x54, 0x20, 0x28, 0xb0, 0x43, 0x29, 0x0a))).toBe('text'); // "T (°C)" in Latin-1: invalid UTF-8 still text
    expect(sniffBytes(Uint8Array.of(0xff, 0xfe, 0x6a, 0x00, 0x2c, 0x00, 0x56, 0x00))).toBe('text'); // "j,V" UTF-16LE with BOM
  });
  it('checks its argument', () => {
    expect(() => sniffBytes('text' as never)).toThrow(TypeError);
  });
});

describe('decodeText', () => {
  it('decodes UTF-8 and drops the BOM', () => {
    expect(decodeText(Uint8Array.of(0xef, 0xbb, 0xbf, 0x6a, 0xc2, 0xb2))).toBe('j²'); // U+00B2 is C2 B2 in UTF-8 (Unicode §3.9)
  });
  it('falls back to windows-1252 for bytes that are not UTF-8', () => {
    expect(decodeText(Uint8Array.of(0x54, 0xb0, 0x43))).toBe('T°C'); // 0xB0 is ° in windows-1252 (WHATWG index)
    expect(decodeText(Uint8Array.of(0xb5, 0x41, 0x80))).toBe('µA€'); // 0xB5 µ, 0x80 € in windows-1252 (WHATWG index)
  });
  it('decodes UTF-16 with a BOM and without one', () => {
    expect(decodeText(Uint8Array.of(0xff, 0xfe, 0x6a, 0x00, 0x2c, 0x00, 0x56, 0x00))).toBe('j,V');
    expect(decodeText(Uint8Array.of(0xfe, 0xff, 0x00, 0x6a, 0x00, 0x2c, 0x00, 0x56))).toBe('j,V');
    expect(decodeText(Uint8Array.of(0x6a, 0x00, 0x2c, 0x00, 0x56, 0x00, 0x0a, 0x00))).toBe('j,V\n');
  });
  it('returns an empty string for no bytes and checks its argument', () => {
    expect(decodeText(new Uint8Array(0))).toBe('');
    expect(() => decodeText([1, 2] as never)).toThrow(TypeError);
  });
});

describe('createChunkDecoder', () => {
  const decodeInChunks = (bytes: Uint8Array, size: number): { encoding: string; text: string } => {
    const decoder = createChunkDecoder(bytes.subarray(0, 8));
    let text = '';
    for (let offset = 0; offset < bytes.length; offset += size) text += decoder.decode(bytes.subarray(offset, offset + size), { stream: true });
    return { encoding: decoder.encoding, text: text + decoder.decode() };
  };
  it('carries UTF-8 characters split across chunks and drops the BOM', () => {
    const bytes = new TextEncoder().encode('\uFEFFT (°C);j (mA/cm²)\n');
    expect(decodeInChunks(bytes, 1)).toEqual({ encoding: 'utf-8', text: 'T (°C);j (mA/cm²)\n' });
  });
  it('reads windows-1252 chunk by chunk', () => {
    expect(decodeInChunks(Uint8Array.of(0x54, 0xb0, 0x43, 0x80, 0x0a), 2)).toEqual({ encoding: 'windows-1252', text: 'T°C€\n' }); // WHATWG index-windows-1252
  });
  it('reads UTF-16LE with a BOM chunk by chunk', () => {
    expect(decodeInChunks(Uint8Array.of(0xff, 0xfe, 0x6a, 0x00, 0x2c, 0x00, 0x56, 0x00), 3)).toEqual({ encoding: 'utf-16le', text: 'j,V' });
  });
  it('checks its argument', () => {
    expect(() => createChunkDecoder('x' as never)).toThrow(TypeError);
  });
});
