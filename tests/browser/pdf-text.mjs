// The text a pdfkit document draws: its streams are written uncompressed (compress: false) and
// Helvetica strings as hex inside TJ arrays. Enough to find labels in the review pack's PDF.
export function pdfText(bytes) {
  const source = Buffer.from(bytes).toString('latin1');
  return [...source.matchAll(/\[((?:<[0-9a-f]+>\s*-?[\d.]*\s*)+)\]\s*TJ/gi)]
    .map((m) => [...m[1].matchAll(/<([0-9a-f]+)>/gi)].map((h) => Buffer.from(h[1], 'hex').toString('latin1')).join(''))
    .join('\n');
}
