import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  fromBase64Url,
  machineFromHash,
  machineHash,
  machineLink,
  toBase64Url,
} from '../../../src/web/controllers/link.js';

describe('src/web/controllers/link', () => {
  it('encodes the RFC 4648 §10 test vectors in the URL-safe alphabet without padding', () => {
    // RFC 4648 §10: BASE64("f") = "Zg==", BASE64("fo") = "Zm8=", BASE64("foobar") = "Zm9vYmFy".
    expect(toBase64Url('')).toBe('');
    expect(toBase64Url('f')).toBe('Zg');
    expect(toBase64Url('fo')).toBe('Zm8');
    expect(toBase64Url('foobar')).toBe('Zm9vYmFy');
    // "?>?" is 3F 3E 3F: standard base64 "Pz4/", URL-safe (RFC 4648 §5) "Pz4_".
    expect(toBase64Url('?>?')).toBe('Pz4_');
  });

  it("agrees with Node's own base64url (RFC 4648 §5) on any text, and decodes back", () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme', maxLength: 200 }), (s) => {
        const code = toBase64Url(s);
        expect(code).toBe(Buffer.from(s, 'utf8').toString('base64url'));
        expect(fromBase64Url(code)).toBe(s);
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('refuses text that is not base64url of UTF-8', () => {
    expect(fromBase64Url('a+b')).toBeUndefined();
    expect(fromBase64Url('abcde')).toBeUndefined();
    expect(fromBase64Url(Buffer.from([0xff, 0xfe, 0xfd]).toString('base64url'))).toBeUndefined();
  });

  it('carries a machine in the fragment of a link', () => {
    const text = 'machine φ_demo\nstart a\nstate a\n  go a\n';
    expect(machineHash(text)).toBe(`#m=${toBase64Url(text)}`);
    expect(machineFromHash(machineHash(text))).toBe(text);
    expect(machineFromHash(`#x=1&m=${toBase64Url(text)}`)).toBe(text);
    expect(machineFromHash('#view=2')).toBeUndefined();
    expect(machineLink('http://127.0.0.1:5178/?a=1#m=old', text)).toBe(
      `http://127.0.0.1:5178/?a=1#m=${toBase64Url(text)}`,
    );
  });
});
