/**
 * Shareable links: the machine's text travels in the URL fragment as `#m=` + base64url of its
 * UTF-8 bytes (RFC 4648 §5, no padding), so a link carries the whole machine and no server
 * ever sees it (a fragment is not sent with the request).
 */

const KEY = 'm=';

/** base64url (RFC 4648 §5) of the text's UTF-8 bytes, without padding. */
export function toBase64Url(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let bin = '';
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(bin).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

/** The text back from base64url, or undefined when it is not base64url of UTF-8. */
export function fromBase64Url(code: string): string | undefined {
  if (!/^[A-Za-z0-9_-]*$/.test(code) || code.length % 4 === 1) return undefined;
  try {
    const bin = atob(code.replace(/-/g, '+').replace(/_/g, '/'));
    const bytes = Uint8Array.from(bin, (c) => c.charCodeAt(0));
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return undefined;
  }
}

/** The fragment that carries a machine: `#m=…`. */
export function machineHash(text: string): string {
  return `#${KEY}${toBase64Url(text)}`;
}

/** The machine a fragment carries, if it carries one. */
export function machineFromHash(hash: string): string | undefined {
  const h = hash.startsWith('#') ? hash.slice(1) : hash;
  for (const part of h.split('&')) if (part.startsWith(KEY)) return fromBase64Url(part.slice(KEY.length));
  return undefined;
}

/** A full link to the page carrying the machine. */
export function machineLink(pageUrl: string, text: string): string {
  const base = pageUrl.split('#')[0];
  return base + machineHash(text);
}
