/**
 * Password hashing with Argon2id (oslo, backed by @node-rs/argon2's prebuilt binary: no native build on install).
 * OWASP's minimum Argon2id settings (19 MiB, 2 iterations, 1 lane) are oslo's defaults.
 */
import { Argon2id } from 'oslo/password';

const argon2id = new Argon2id();

/** Hashes a password into a self-describing `$argon2id$...` string. @param password - the plain password */
export function hashPassword(password: string): Promise<string> {
  return argon2id.hash(password);
}

/**
 * Checks a password against a stored hash.
 * @param hash - the stored `$argon2id$...` string
 * @param password - the password typed at sign-in
 */
export function verifyPassword(hash: string, password: string): Promise<boolean> {
  return argon2id.verify(hash, password);
}

/** A hash of a random password, verified against when the e-mail is unknown so both failures take as long. */
let decoyHash: Promise<string> | undefined;

/** The decoy hash (made on first use). */
export function decoyPasswordHash(): Promise<string> {
  decoyHash ??= argon2id.hash(crypto.randomUUID());
  return decoyHash;
}
