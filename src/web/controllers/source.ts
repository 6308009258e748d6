/**
 * The machine's text and everything that keeps it safe: autosave to local storage on every
 * change, the shareable link in the URL fragment (kept current, so a reload shows the same
 * machine), the unsaved-changes warning on leaving, and the earlier text kept whenever the
 * bench is replaced (by a file, an example or a link) so it can be brought back.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { FIRST_EXAMPLE, type Example } from '../examples.js';
import { download, openedText, savedText, type SaveForm } from './files.js';
import { keepGet, keepSet } from './keep.js';
import { machineFromHash, machineHash, machineLink } from './link.js';

/** Where the text on the bench came from. */
export const Origin = { example: 'example', autosave: 'autosave', link: 'link', file: 'file', typed: 'typed' } as const;
export type Origin = (typeof Origin)[keyof typeof Origin];

/** A message above the editor. `restore` offers to bring the earlier text back. */
export interface Notice {
  readonly tone: 'info' | 'problem';
  readonly words: string;
  readonly details?: readonly string[];
  readonly restore?: boolean;
}

/** The address bar follows the text after this pause in typing. */
const HASH_DELAY_MS = 400;
/** Fingerprints of the texts this page wrote into links, kept to tell its own links from others'. */
const WRITTEN_KEPT = 64;

/** A short fingerprint of a text (FNV-1a, 32 bits): enough to recognise our own links. */
function fingerprint(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(36);
}

export class SourceController implements ReactiveController {
  text = '';
  file = FIRST_EXAMPLE.file;
  origin: Origin = Origin.example;
  /** Changed since it was last saved to (or opened from) a file. */
  dirty = false;
  rev = 0;
  notice: Notice | undefined;
  private previous: { text: string; file: string } | undefined;
  private hashTimer: ReturnType<typeof setTimeout> | undefined;

  constructor(
    private readonly host: ReactiveControllerHost,
    private readonly changed: (text: string, file: string, rev: number) => void,
  ) {
    host.addController(this);
  }

  hostConnected(): void {
    const linked = machineFromHash(location.hash);
    const saved = keepGet('text');
    const savedFile = keepGet('file') ?? 'machine.lw';
    const kept = keepGet('previous');
    if (kept) this.previous = JSON.parse(kept) as { text: string; file: string };
    // A fragment this page wrote itself may lag the autosave by the hash delay: the autosave
    // wins. Any other fragment is a link someone opened: it wins, and the autosave is kept.
    const foreign = linked !== undefined && !this.wrote(linked);
    if (foreign && linked !== undefined) {
      const differs = saved !== undefined && saved !== linked;
      if (differs) this.keepPrevious(saved, savedFile);
      this.place(linked, 'shared.lw', Origin.link, differs ? 'Opened the machine carried by the link.' : undefined);
    } else if (saved !== undefined) {
      this.dirty = keepGet('dirty') === '1';
      this.place(saved, savedFile, Origin.autosave);
    } else {
      this.place(FIRST_EXAMPLE.text, FIRST_EXAMPLE.file, Origin.example);
    }
    addEventListener('beforeunload', this.onLeave);
    addEventListener('pagehide', this.flushHash);
    addEventListener('hashchange', this.onHash);
  }

  hostDisconnected(): void {
    removeEventListener('beforeunload', this.onLeave);
    removeEventListener('pagehide', this.flushHash);
    removeEventListener('hashchange', this.onHash);
  }

  /** The user typed: the new text. */
  edit(text: string): void {
    if (text === this.text) return;
    this.dirty = true;
    this.place(text, this.file, Origin.typed);
  }

  /** Put an example on the bench, keeping what was there. */
  useExample(e: Example): void {
    this.replace(e.text, e.file, Origin.example, `Loaded the example “${e.title}”.`);
  }

  /** Open a file in any accepted form. */
  async open(f: File): Promise<void> {
    const o = openedText(await f.text(), f.name);
    if (!o.ok) {
      this.say({ tone: 'problem', words: `${f.name} could not be read; the bench is unchanged.`, details: o.problems });
      return;
    }
    this.replace(o.text, o.file, Origin.file, o.note ?? `Opened ${f.name}.`);
    this.dirty = false;
    keepSet('dirty', '0');
  }

  /** Save the machine as a download in one of the forms. */
  save(form: SaveForm): void {
    const s = savedText(this.text, this.file, form);
    if ('problems' in s) {
      this.say({ tone: 'problem', words: s.problems.join(' ') });
      return;
    }
    download(s.name, s.mime, s.text);
    if (form === 'text') {
      this.dirty = false;
      keepSet('dirty', '0');
    }
    this.say({ tone: 'info', words: `Saved as ${s.name}.` });
    this.host.requestUpdate();
  }

  /** The shareable link of the machine on the bench. */
  link(): string {
    return machineLink(location.href, this.text);
  }

  /** Bring back the text the last replacement put aside (and put the current one aside). */
  restore(): void {
    const p = this.previous;
    if (!p) return;
    this.replace(p.text, p.file, Origin.typed, 'Brought back the earlier machine.');
    this.dirty = true;
    keepSet('dirty', '1');
  }

  get canRestore(): boolean {
    return this.previous !== undefined;
  }

  say(n: Notice | undefined): void {
    this.notice = n;
    this.host.requestUpdate();
  }

  private replace(text: string, file: string, origin: Origin, words: string): void {
    if (this.text.trim() !== '' && this.text !== text) this.keepPrevious(this.text, this.file);
    this.dirty = false;
    this.place(text, file, origin, words);
  }

  private keepPrevious(text: string, file: string): void {
    this.previous = { text, file };
    keepSet('previous', JSON.stringify(this.previous));
  }

  private place(text: string, file: string, origin: Origin, words?: string): void {
    this.text = text;
    this.file = file;
    this.origin = origin;
    this.rev++;
    keepSet('text', text);
    keepSet('file', file);
    keepSet('dirty', this.dirty ? '1' : '0');
    clearTimeout(this.hashTimer);
    this.hashTimer = setTimeout(this.flushHash, HASH_DELAY_MS);
    if (words) this.notice = { tone: 'info', words, restore: this.previous !== undefined };
    this.changed(text, file, this.rev);
    this.host.requestUpdate();
  }

  /** Write the link of the current text into the address bar (browsers limit how often). */
  private readonly flushHash = (): void => {
    clearTimeout(this.hashTimer);
    const hash = machineHash(this.text);
    const mark = fingerprint(this.text);
    const written = (keepGet('written') ?? '').split(' ').filter((w) => w !== '' && w !== mark);
    keepSet('written', [...written.slice(-(WRITTEN_KEPT - 1)), mark].join(' '));
    if (location.hash !== hash) history.replaceState(null, '', hash);
  };

  /** Did this page put that text in a link itself? */
  private wrote(text: string): boolean {
    return (keepGet('written') ?? '').split(' ').includes(fingerprint(text));
  }

  private readonly onLeave = (e: BeforeUnloadEvent): void => {
    this.flushHash();
    if (!this.dirty) return;
    e.preventDefault();
    // Older browsers show the prompt only when returnValue is set.
    e.returnValue = '';
  };

  private readonly onHash = (): void => {
    const linked = machineFromHash(location.hash);
    if (linked !== undefined && linked !== this.text)
      this.replace(linked, 'shared.lw', Origin.link, 'Opened the machine carried by the link.');
  };
}
