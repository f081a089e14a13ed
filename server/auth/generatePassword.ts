/** Passwords an admin hands over after a reset: random, easy to read aloud and type. */

/** 31 characters without look-alikes (no 0/o, 1/l/i). */
const ALPHABET = 'abcdefghjkmnpqrstuvwxyz23456789';
/** Bytes at or above this are drawn again, so every character is equally likely (248 = 8 × 31). */
const UNBIASED_LIMIT = 256 - (256 % ALPHABET.length);

/**
 * A random password of four groups of four characters (`xxxx-xxxx-xxxx-xxxx`, about 79 bits from the operating
 * system's generator), well above the 10-character minimum.
 */
export function generatePassword(): string {
  const chars: string[] = [];
  const bytes = new Uint8Array(32);
  while (chars.length < 16) {
    crypto.getRandomValues(bytes);
    for (const byte of bytes)
      if (byte < UNBIASED_LIMIT && chars.length < 16) chars.push(ALPHABET[byte % ALPHABET.length]);
  }
  return [0, 4, 8, 12].map((start) => chars.slice(start, start + 4).join('')).join('-');
}
