/**
 * The frame's drawing worker: draws a large build's frame (the core's frameSvg in the screen
 * palette, the same drawing as frame.svg) away from the page, which answers meanwhile
 * (frame/drawing.ts sends it the builds whose frames are large). It keeps nothing between drawings.
 */
import { frameSvg, type Build, type Placement, type Profile } from '../../core/index.js';

/** A drawing asked for: the build, its placement and profile, and the asker's number for it. */
export interface ToFrameDrawer {
  readonly id: number;
  readonly build: Build;
  readonly placement: Placement;
  readonly profile: Profile;
}

/** The drawing, or why there is none. */
export interface FromFrameDrawer {
  readonly id: number;
  readonly svg?: string;
  readonly problem?: string;
}

const scope = self as unknown as {
  postMessage(m: FromFrameDrawer): void;
  onmessage: ((e: MessageEvent<ToFrameDrawer>) => void) | null;
};

scope.onmessage = (e) => {
  const { id, build, placement, profile } = e.data;
  try {
    scope.postMessage({ id, svg: frameSvg(build, placement, profile, { palette: 'screen' }) });
  } catch (err) {
    scope.postMessage({ id, problem: err instanceof Error ? err.message : String(err) });
  }
};
