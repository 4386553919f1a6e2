/**
 * UTF-8 text decoding and encoding through the platform's TextDecoder/TextEncoder (present in Node,
 * browsers and Web Workers), reached via globalThis so the pure core needs no DOM or Node typings.
 */

/** A streaming UTF-8 decoder. */
export interface Utf8Decoder {
  /** Decodes a piece; with `stream` true a multi-byte sequence split across pieces is held back. */
  decode(bytes: Uint8Array, opts?: { stream?: boolean }): string;
}

interface Codecs {
  TextDecoder: new (label?: string, opts?: { fatal?: boolean; ignoreBOM?: boolean }) => Utf8Decoder;
  TextEncoder: new () => { encode(text: string): Uint8Array };
}

/**
 * Creates a UTF-8 decoder that replaces invalid sequences with U+FFFD and drops a leading byte-order mark.
 * @returns the decoder
 * @throws TypeError when the platform has no TextDecoder
 */
export function createUtf8Decoder(): Utf8Decoder {
  const C = (globalThis as unknown as Partial<Codecs>).TextDecoder;
  if (!C) throw new TypeError('this platform has no TextDecoder');
  return new C('utf-8');
}

/**
 * Encodes text as UTF-8.
 * @param text - the text
 * @returns its UTF-8 bytes
 * @throws TypeError when the platform has no TextEncoder
 */
export function encodeUtf8(text: string): Uint8Array {
  const C = (globalThis as unknown as Partial<Codecs>).TextEncoder;
  if (!C) throw new TypeError('this platform has no TextEncoder');
  return new C().encode(text);
}

/**
 * Decodes a whole UTF-8 byte range.
 * @param bytes - the bytes
 * @returns the text
 */
export function decodeUtf8(bytes: Uint8Array): string {
  return createUtf8Decoder().decode(bytes);
}
