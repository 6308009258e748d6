/** Is this a screen worked by touch (a phone or a tablet)? Hints then name touch gestures, not keys and wheels. */
export function touchScreen(): boolean {
  return (globalThis.matchMedia?.('(any-pointer: coarse)').matches ?? false) || navigator.maxTouchPoints > 0;
}
