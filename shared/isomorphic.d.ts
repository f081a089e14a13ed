/**
 * The few run-time globals that both browsers and Node (20 and later) provide, as far as shared/ and templates/ use
 * them. Those two folders compile without the DOM and Node type libraries (tsconfig.shared.json), so that code there
 * cannot reach for an API that exists on one side only; declare here only what both sides have, with the narrow
 * signature the code needs.
 */

/** Base64 of a binary string (one character per byte). */
declare function btoa(data: string): string;
/** The binary string (one character per byte) a base64 text stands for. */
declare function atob(data: string): string;

/** UTF-8 encoder (WHATWG Encoding). */
declare class TextEncoder {
  encode(input?: string): Uint8Array<ArrayBuffer>;
}

/** Decoder for a named text encoding, UTF-8 by default (WHATWG Encoding). */
declare class TextDecoder {
  constructor(label?: string, options?: { fatal?: boolean; ignoreBOM?: boolean });
  decode(input?: ArrayBuffer | ArrayBufferView): string;
}

/** Web Crypto, as far as hashing and random ids go. */
declare const crypto: {
  readonly subtle: {
    digest(algorithm: 'SHA-256', data: ArrayBuffer | ArrayBufferView<ArrayBuffer>): Promise<ArrayBuffer>;
  };
  randomUUID(): string;
};

/** High-resolution time in milliseconds (WHATWG High Resolution Time; Node has it as a global too). */
declare const performance: { now(): number };
