export function pdfText(bytes: Uint8Array): string;
