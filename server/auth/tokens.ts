// Random tokens for sessions, invitations and API access; only their SHA-256 is stored.
import { randomBytes, createHash } from 'node:crypto';

export function newToken(bytes = 32): string {
  return randomBytes(bytes).toString('base64url');
}

export function sha256(text: string): string {
  return createHash('sha256').update(text).digest('hex');
}
