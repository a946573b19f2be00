/** Receipt numbers: `VLR-` + UTC date + 6 random characters from an unambiguous alphabet. */
import { randomInt } from 'node:crypto';

const ALPHABET = 'ABCDEFGHJKLMNPQRSTUVWXYZ23456789';

export function newReceiptNumber(at = new Date()): string {
  const day = at.toISOString().slice(0, 10).replace(/-/g, '');
  let tail = '';
  for (let i = 0; i < 6; i++) tail += ALPHABET[randomInt(ALPHABET.length)];
  return `VLR-${day}-${tail}`;
}
