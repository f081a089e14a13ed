/** A new random text id (UUID v4), the default for every text primary key the application creates. */
export function newId(): string {
  return crypto.randomUUID();
}
