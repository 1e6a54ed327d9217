/**
 * SHA-256 message digest — answers "what is the 256-bit fingerprint of this text?"
 *
 * Source: NIST FIPS 180-4 (2015), Secure Hash Standard, computed by the platform: Web Crypto
 * (W3C Web Cryptography API, `SubtleCrypto.digest`), which browsers and Node 20 both provide as
 * `globalThis.crypto.subtle`. Text is encoded as UTF-8 by the platform's `TextEncoder` (WHATWG Encoding;
 * lone surrogates become U+FFFD).
 *
 * Preconditions: a platform with Web Crypto. Browsers offer it only in secure contexts (https:// pages and
 * localhost), which the app needs anyway for its service worker; without it this throws a RangeError.
 * Returns: a promise of the digest as 64 lower-case hexadecimal characters. It is asynchronous: never await
 * it inside an IndexedDB transaction (the transaction would commit while the hash is computed).
 *
 * The core's tsconfig has no DOM or Node types, so the two platform objects used here are typed locally
 * with the few members this file calls.
 *
 * @example await sha256Hex('abc') === 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'
 */

interface PlatformCrypto {
  subtle?: { digest(algorithm: 'SHA-256', data: Uint8Array): Promise<ArrayBuffer> };
}
interface Platform {
  crypto?: PlatformCrypto;
  TextEncoder: new () => { encode(text: string): Uint8Array };
}

const platform = globalThis as unknown as Platform;

/** SHA-256 of a string's UTF-8 encoding, or of bytes; lower-case hex. */
export async function sha256Hex(message: string | Uint8Array): Promise<string> {
  const subtle = platform.crypto?.subtle;
  if (subtle === undefined)
    throw new RangeError('sha256Hex requires Web Crypto (crypto.subtle: an https:// page or Node 20)');
  const bytes = typeof message === 'string' ? new platform.TextEncoder().encode(message) : message;
  const digest = new Uint8Array(await subtle.digest('SHA-256', bytes));
  let hex = '';
  for (const b of digest) hex += b.toString(16).padStart(2, '0');
  return hex;
}
