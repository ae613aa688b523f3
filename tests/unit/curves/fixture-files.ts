// Reads a file of tests/fixtures/curves as bytes or text (test helper, Node only).
import { readFileSync } from 'node:fs';

const folder = new URL('../../fixtures/curves/', import.meta.url);

export function fixtureBytes(name: string): Uint8Array {
  return new Uint8Array(readFileSync(new URL(name, folder)));
}

export function fixtureText(name: string): string {
  return readFileSync(new URL(name, folder), 'utf8');
}
