/**
 * The one place figures are written for people: money, durations, masses, lengths and temperatures, with the unit
 * constants they rest on. Screens, documents, mails and the CLI all format through here.
 */
export * from './locale';
export * from './units';
export * from './money';
export * from './duration';
export * from './mass';
export * from './length';
export * from './temperature';
export * from './date';
