/** A stand-in for the element a controller serves, for the controllers' tests: it counts the updates asked of it. */
import type { ReactiveController, ReactiveControllerHost } from 'lit';

export function host(): ReactiveControllerHost & { updates: number } {
  return {
    updates: 0,
    addController(_c: ReactiveController) {},
    removeController(_c: ReactiveController) {},
    requestUpdate() {
      this.updates++;
    },
    updateComplete: Promise.resolve(true),
  };
}
