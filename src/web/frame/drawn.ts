/**
 * The frame drawing once it is in the page (<lw-frame>, src/web/elements/frame-view.ts): made
 * ready as its elements arrive — every cord branch focusable, with a wider unseen copy over it
 * to point at — and indexed by cord branch, by whole path and by part, so that lighting a cord
 * and standing the levers touch only the elements concerned, however many cords the frame has.
 *
 * Lighting a branch dims the group of every cord as one element (one restyle, where a class on
 * the sheet would restyle every cord) and draws the lit branch and its whole path again above
 * it, at full strength; the branch, its whole path and its two ends (the capstan that pulls it
 * with its bay's label, the lever it is tied to) carry the classes `lit` and `end from` /
 * `end to` as before, for the view's styles and its tests. For a part dragged onto another bay
 * it measures where every bay's lever ends and label are on screen (`bayEnds`), and marks the
 * part picked and the bay it would go to (`pick`: classes `picked`, `drop`).
 */
import type { BranchRoute } from '../../core/index.js';
import type { BaySpot } from '../controllers/pins.js';
import type { BayBox } from './bays.js';
import type { Piece } from './pieces.js';
import type { Stands } from './stands.js';

const SVG_NS = 'http://www.w3.org/2000/svg';

/** A branch of a cord, as the drawing names it (data-cord, data-target). */
const branchKey = (cord: string | null, target: string | null): string => `${cord ?? ''}\u0000${target ?? ''}`;

/** A part's lever end or its bay label (of a part's drawn elements: what is picked up, measured and marked). */
const partEnd = (el: Element): boolean => el.matches('rect.lever') || el.localName === 'g';

export class DrawnFrame {
  /** The drawn branches (path.cord), their whole paths (path.route) and each part's other elements. */
  private readonly cords = new Map<string, Element[]>();
  private readonly routes = new Map<string, Element>();
  private readonly parts = new Map<string, Element[]>();
  private readonly levers: Element[] = [];
  /** The group of every cord, dimmed while one is lit (found once it is in); the copies of the lit one drawn above it. */
  private cordGroup: Element | null;
  private readonly copies: SVGGElement;
  private marked: Element[] = [];
  /** The elements of the part picked to keep in a bay, and of the bay it would be dropped on. */
  private picked: Element[] = [];
  private stands: Stands | undefined;

  constructor(readonly root: SVGSVGElement) {
    this.cordGroup = null;
    this.copies = document.createElementNS(SVG_NS, 'g');
    this.copies.setAttribute('class', 'lit-copies');
    this.copies.setAttribute('aria-hidden', 'true');
    this.take(root);
    root.append(this.copies);
  }

  /** Make ready and index the elements under `scope`: the whole drawing, or a piece of it before it goes in. */
  take(scope: ParentNode): void {
    this.cordGroup ??= scope.querySelector('g.cords');
    for (const path of scope.querySelectorAll('path.cord[data-cord]')) {
      path.setAttribute('tabindex', '0');
      path.setAttribute('role', 'button');
      path.setAttribute('aria-label', `Cord ${path.querySelector('title')?.textContent ?? ''}`);
      // A wider, unseen copy over it, so a finger or a pointer finds a cord a fraction of a millimetre thick.
      const hit = path.cloneNode(true) as Element;
      hit.setAttribute('class', 'hit');
      for (const a of ['tabindex', 'role', 'aria-label']) hit.removeAttribute(a);
      hit.setAttribute('aria-hidden', 'true');
      path.after(hit);
      const k = branchKey(path.getAttribute('data-cord'), path.getAttribute('data-target'));
      const list = this.cords.get(k) ?? [];
      list.push(path);
      this.cords.set(k, list);
    }
    for (const route of scope.querySelectorAll('path.route'))
      this.routes.set(branchKey(route.getAttribute('data-route-cord'), route.getAttribute('data-route-target')), route);
    for (const el of scope.querySelectorAll('[data-part]:not([data-cord])')) {
      const part = el.getAttribute('data-part') ?? '';
      const list = this.parts.get(part) ?? [];
      list.push(el);
      this.parts.set(part, list);
    }
    const levers = [...scope.querySelectorAll('rect.lever[data-part][data-lever]')];
    this.levers.push(...levers);
    this.stand(levers);
  }

  /**
   * Put a piece of the drawing in (frame/pieces.ts): parsed apart from the page, made ready and
   * indexed, then put at the end of the root (before the copies of the lit cord) or of its group.
   */
  put(piece: Piece): void {
    const into = piece.group < 0 ? this.root : this.root.children[piece.group];
    if (into === this.copies) return;
    const range = document.createRange();
    range.selectNodeContents(into);
    const part = range.createContextualFragment(piece.text);
    this.take(part);
    if (into === this.root) this.root.insertBefore(part, this.copies);
    else into.append(part);
  }

  /** Every lever end takes its stand in the trial run (none when the trial run has no machine). */
  setStands(stands: Stands | undefined): void {
    this.stands = stands;
    this.stand(this.levers);
  }

  private stand(levers: readonly Element[]): void {
    for (const el of levers) {
      const s = this.stands?.get(el.getAttribute('data-part') ?? '')?.get(el.getAttribute('data-lever') ?? '');
      if (s === undefined) el.removeAttribute('data-stand');
      else if (el.getAttribute('data-stand') !== s) el.setAttribute('data-stand', s);
    }
  }

  /** The screen boxes of every part's lever ends and label, as the bay it stands in (`spotOf`, from the placement). */
  bayEnds(spotOf: (part: string) => BaySpot | undefined): BayBox[] {
    const out: BayBox[] = [];
    for (const [part, els] of this.parts) {
      const spot = spotOf(part);
      if (!spot) continue;
      for (const el of els) {
        if (!partEnd(el)) continue;
        const r = el.getBoundingClientRect();
        out.push({ ...spot, left: r.left, right: r.right, top: r.top, bottom: r.bottom });
      }
    }
    return out;
  }

  /** Mark the part picked to keep in a bay (class `picked`) and the parts of the bay it would be dropped on (`drop`). */
  pick(picked: string | undefined, drop: readonly string[]): void {
    for (const el of this.picked) el.classList.remove('picked', 'drop');
    this.picked = [];
    const mark = (part: string, cls: string): void => {
      for (const el of this.parts.get(part) ?? []) {
        if (!partEnd(el)) continue;
        el.classList.add(cls);
        this.picked.push(el);
      }
    };
    if (picked !== undefined) mark(picked, 'picked');
    for (const p of drop) if (p !== picked) mark(p, 'drop');
  }

  /** Light branch `b` (none when undefined): its run, its whole path, and its capstan end and lever end. */
  light(b: BranchRoute | undefined): void {
    this.lightAll(b ? [b] : []);
  }

  /** Light every branch of `bs` at once (the shakedown's suspect cords), each as `light` lights one. */
  lightAll(bs: readonly BranchRoute[]): void {
    for (const el of this.marked) el.classList.remove('lit', 'end', 'from', 'to');
    this.marked = [];
    this.copies.replaceChildren();
    this.cordGroup?.classList.toggle('veiled', bs.length > 0);
    for (const b of bs) this.mark(b);
  }

  private mark(b: BranchRoute): void {
    const k = branchKey(b.cord, b.target);
    const route = this.routes.get(k);
    for (const el of [...(this.cords.get(k) ?? []), ...(route ? [route] : [])]) {
      el.classList.add('lit');
      this.marked.push(el);
      this.copies.append(copyOf(el));
    }
    const lever = b.kind === 'port' ? b.target.slice(b.part.length + 1) : 'exit';
    const end = (el: Element, side: string): void => {
      el.classList.add('end', side);
      this.marked.push(el);
    };
    for (const el of this.parts.get(b.driver) ?? []) if (el.getAttribute('data-lever') === null) end(el, 'from');
    for (const el of this.parts.get(b.part) ?? []) {
      const at = el.getAttribute('data-lever');
      if (at === null ? el.localName === 'g' : at === lever) end(el, 'to');
    }
  }
}

/** A lit path drawn again above the dimmed cords: its line and its cord's colour, nothing to point at. */
function copyOf(el: Element): Element {
  const c = document.createElementNS(SVG_NS, 'path');
  c.setAttribute('d', el.getAttribute('d') ?? '');
  const colour = el.parentElement?.getAttribute('stroke') ?? '';
  // The black of the paper's palette is the page's ink on screen (as the drawing's own style has it).
  c.style.stroke = colour === '#000000' || colour === '' ? 'var(--lw-ink)' : colour;
  return c;
}
