/** Elements report what the user did with events that bubble out of their shadow roots. */

/** Dispatch a bubbling, composed custom event. */
export function emit<T>(from: EventTarget, name: string, detail: T): void {
  from.dispatchEvent(new CustomEvent<T>(name, { detail, bubbles: true, composed: true }));
}
