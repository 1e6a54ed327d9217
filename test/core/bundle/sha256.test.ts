/**
 * SHA-256 (src/bundle/digest.ts: the platform's Web Crypto digest, text encoded as UTF-8) against the NIST
 * example vectors.
 * Source: NIST CSRC "Cryptographic Standards and Guidelines — Examples with Intermediate Values",
 * SHA256.pdf (one-block "abc", two-block 448-bit message), FIPS 180-4 (2015) §6.2; the empty-string and
 * one-million-"a" digests are the widely published NIST test values (evidence: memory, confirmed
 * with `python3 -c "import hashlib; print(hashlib.sha256(b'abc').hexdigest())"` and likewise).
 * A second, independent check compares with Python's hashlib (outside the project; its answers committed
 * in test/fixtures/python-sha256.json by test/fixtures/python-oracle.ts) on UTF-8 text
 * including non-ASCII, astral characters and lengths around the 55/56/64-byte padding edges, and a lone
 * surrogate (WHATWG Encoding encodes it as U+FFFD; Python refuses to encode one, so Python is given the
 * replacement character itself).
 */
import { describe, expect, it } from 'vitest';
import { sha256Hex } from '../../../src/bundle/digest.ts';
import { pythonOracle } from '../../fixtures/python-oracle.ts';

// Python's hashlib, run once and committed (test/fixtures/python-sha256.json)
const python = pythonOracle('sha256');

describe('sha256Hex — NIST vectors', () => {
  it('"abc" (one block)', async () => {
    expect(await sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
  it('448-bit message (two blocks)', async () => {
    expect(await sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
  });
  it('empty string', async () => {
    expect(await sha256Hex('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });
  it('one million "a"', async () => {
    expect(await sha256Hex('a'.repeat(1_000_000))).toBe(
      'cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0',
    );
  });
  it('896-bit message', async () => {
    expect(
      await sha256Hex(
        'abcdefghbcdefghicdefghijdefghijkefghijklfghijklmghijklmnhijklmnoijklmnopjklmnopqklmnopqrlmnopqrsmnopqrstnopqrstu',
      ),
    ).toBe('cf5b16a778af8380036ce59e7b0492370b249b11e8f07a51afac45037afee9d1');
  });
});

describe('sha256Hex — against Python hashlib on UTF-8 text', () => {
  const samples = [
    'Ærøskøbing — «quadrat 7»',
    'Carex nigra 🌿 plot',
    'x'.repeat(55),
    'x'.repeat(56),
    'x'.repeat(63),
    'x'.repeat(64),
    'x'.repeat(119),
    '日本語のメモ\r\n"quoted", comma',
  ];
  const py = python(
    'import sys,json,hashlib\nfor s in json.load(sys.stdin): print(hashlib.sha256(s.encode("utf-8")).hexdigest())',
    JSON.stringify(samples),
  )
    .trim()
    .split('\n');
  it('a lone surrogate is hashed as U+FFFD (WHATWG Encoding)', async () => {
    expect(await sha256Hex('a\ud800b')).toBe(await sha256Hex('a\ufffdb'));
    expect(await sha256Hex('a\ufffdb')).toBe(
      python('import hashlib; print(hashlib.sha256("a\\ufffdb".encode()).hexdigest())').trim(),
    );
  });
  it('bytes are hashed as given', async () => {
    expect(await sha256Hex(new Uint8Array([0x61, 0x62, 0x63]))).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
  });
  samples.forEach((s, i) => {
    it(`sample ${i} (${s.length} UTF-16 units)`, async () => {
      expect(await sha256Hex(s)).toBe(py[i]);
    });
  });
});
