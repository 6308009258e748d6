/**
 * The machine's text and everything that keeps it safe: autosave to local storage on every
 * change, the shareable link in the URL fragment (kept current, so a reload shows the same
 * machine), the earlier text kept whenever the bench is replaced (by a file, an example, a
 * link or New) so it can be brought back, and the file name.
 *
 * Nothing the user typed is lost: stored entries are read defensively (keep.ts sets a bad one
 * aside and the page says so), and leaving the page asks first only when the text is not safe
 * in storage (the browser refused to keep it) — a reload of autosaved work asks nothing.
 *
 * The file name follows the machine's `machine NAME` line (`NAME.lw`) until the user names
 * the file: by opening one, or by giving the bench another name.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { FIRST_EXAMPLE, NEW_MACHINE, type Example } from '../examples.js';
import { download, openedText, savedText, type SaveForm } from './files.js';
import {
  isFileName,
  KEPT_ENTRIES,
  keepRead,
  keepSet,
  parseFlag,
  parseJson,
  takeSetAside,
  type SetAside,
} from './keep.js';
import { machineFromHash, machineHash, machineLink } from './link.js';

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
/** The file name of a machine with no name yet. */
const UNNAMED = 'machine.lw';

/** A short fingerprint of a text (FNV-1a, 32 bits): enough to recognise our own links. */
function fingerprint(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(36);
}

/** The file a machine called `name` is saved as while the user has not named it. */
export function fileFor(name: string): string {
  const safe = name.replace(/[^A-Za-z0-9_.-]+/g, '_').replace(/^[._-]+/, '');
  return safe ? `${safe}.lw` : UNNAMED;
}

/** A name the user typed for the file, made a plain file name ending in .lw (undefined: none). */
export function cleanFileName(typed: string): string | undefined {
  const base = typed
    .trim()
    .replace(/[/\\]/g, '_')
    // eslint-disable-next-line no-control-regex -- control characters never belong in a file name
    .replace(/[\u0000-\u001f\u007f]/g, '');
  if (base === '' || base === '.lw') return undefined;
  const name = /\.[A-Za-z0-9]+$/.test(base) ? base : `${base}.lw`;
  return isFileName(name) ? name : undefined;
}

/** The page's record of its own links: fingerprints separated by spaces. */
const parseWritten = (raw: string): string | undefined => (/^[0-9a-z ]*$/.test(raw) ? raw : undefined);

/** Count a text's link as the page's own, so that an address carrying it is never taken for a link someone opened. */
function markWritten(text: string): void {
  const mark = fingerprint(text);
  const written = (keepRead('written', parseWritten) ?? '').split(' ').filter((w) => w !== '' && w !== mark);
  keepSet('written', [...written.slice(-(WRITTEN_KEPT - 1)), mark].join(' '));
}

function parsePrevious(raw: string): { text: string; file: string } | undefined {
  const v = parseJson(raw);
  if (typeof v !== 'object' || v === null) return undefined;
  const { text, file } = v as Record<string, unknown>;
  return typeof text === 'string' && isFileName(file) ? { text, file } : undefined;
}

/** The notice for entries set aside at start-up, if any. */
function asideNotice(aside: readonly SetAside[]): Notice | undefined {
  if (aside.length === 0) return undefined;
  return {
    tone: 'problem',
    words:
      'Some of what this browser kept for the designer could not be read. Nothing was replaced: ' +
      'each unreadable entry was moved aside in the browser storage, where it still is.',
    details: aside.map((a) =>
      a.aside ? `${KEPT_ENTRIES[a.key]}: kept as ${a.aside}` : `${KEPT_ENTRIES[a.key]}: left where it is, untouched`,
    ),
  };
}

export class SourceController implements ReactiveController {
  text = '';
  file = UNNAMED;
  /** The user named the file (opened one, or renamed it): it no longer follows the machine's name. */
  named = false;
  /** Changed since it was last saved to (or opened from) a file. */
  dirty = false;
  /** The browser refused to keep the latest text: leaving would lose it. */
  unkept = false;
  rev = 0;
  notice: Notice | undefined;
  private previous: { text: string; file: string } | undefined;
  private hashTimer: ReturnType<typeof setTimeout> | undefined;
  /** The machine name the file name was last made from; undefined until the first reading. */
  private seenName: string | undefined;
  /** Take the file name from the first machine name read (a link, New, or a text kept without a name). */
  private adopt = false;

  constructor(
    private readonly host: ReactiveControllerHost,
    private readonly changed: (text: string, file: string, rev: number) => void,
  ) {
    host.addController(this);
  }

  hostConnected(): void {
    const linked = machineFromHash(location.hash);
    const saved = keepRead('text', (raw) => raw);
    const savedFile = keepRead('file', (raw) => (isFileName(raw) ? raw : undefined));
    this.named = keepRead('file-named', parseFlag) ?? false;
    this.previous = keepRead('previous', parsePrevious);
    const dirty = keepRead('dirty', parseFlag);
    const written = keepRead('written', parseWritten);
    // A fragment this page wrote itself may lag the autosave by the hash delay: the autosave
    // wins. Any other fragment is a link someone opened: it wins, and the autosave is kept.
    // When the page's record of its own links is unreadable, the autosave (the latest work)
    // stays on the bench and the link's machine is kept to bring back.
    const own = written === undefined ? undefined : written.split(' ').includes(fingerprint(linked ?? ''));
    if (linked !== undefined && (own === false || saved === undefined)) {
      const differs = saved !== undefined && saved !== linked;
      if (differs) this.keepPrevious(saved, savedFile ?? UNNAMED);
      this.named = false;
      this.adopt = true;
      this.place(linked, UNNAMED, differs ? 'Opened the machine carried by the link.' : undefined);
    } else if (saved !== undefined) {
      if (linked !== undefined && own === undefined && linked !== saved) this.keepPrevious(linked, UNNAMED);
      // Unknown means the text may never have reached a file: say it is changed.
      this.dirty = dirty ?? true;
      this.named = this.named && savedFile !== undefined;
      this.adopt = savedFile === undefined;
      this.place(saved, savedFile ?? UNNAMED);
    } else {
      this.named = false;
      this.place(FIRST_EXAMPLE.text, FIRST_EXAMPLE.file);
    }
    // The address this page came with is dealt with now (opened, or kept to bring back). A reload
    // may come before the page writes its own link (HASH_DELAY_MS) and carry this address again:
    // it must not be taken for a new link then, even when the record above was unreadable.
    if (linked !== undefined) markWritten(linked);
    this.notice = asideNotice(takeSetAside()) ?? this.notice;
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
    this.place(text, this.file);
  }

  /** Put an example on the bench, keeping what was there. */
  useExample(e: Example): void {
    this.replace(e.text, e.file, `Loaded the example “${e.title}”.`);
  }

  /** Start from scratch: a short template with comments, keeping what was there. */
  newMachine(): void {
    this.startFrom(NEW_MACHINE, 'A new machine from the template: write over it.');
  }

  /** Start from a text that has no file of its own (its file name follows its machine's name). */
  startFrom(text: string, words: string): void {
    this.replace(text, UNNAMED, words);
    this.adopt = true;
  }

  /** Open a file in any accepted form. */
  async open(f: File): Promise<void> {
    const o = openedText(await f.text(), f.name);
    if (!o.ok) {
      this.say({ tone: 'problem', words: `${f.name} could not be read; the bench is unchanged.`, details: o.problems });
      return;
    }
    const file = cleanFileName(o.file) ?? UNNAMED;
    this.replace(o.text, file, o.note ?? `Opened ${f.name}.`, true);
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
  }

  /**
   * Give the file another name (the user typed it). An empty name, or the name the machine's
   * own name gives, lets the file name follow the machine again.
   */
  rename(typed: string): void {
    const file = cleanFileName(typed);
    const follows = file === undefined || (this.seenName !== undefined && file === fileFor(this.seenName));
    this.named = !follows;
    keepSet('file-named', this.named ? '1' : '0');
    const next = file ?? (this.seenName !== undefined ? fileFor(this.seenName) : UNNAMED);
    if (next !== this.file) this.place(this.text, next);
    else this.host.requestUpdate();
  }

  /** The machine on the bench read with this name: the file name follows it unless the user named the file. */
  followName(name: string): void {
    const before = this.seenName;
    this.seenName = name;
    if (this.named || name === before) return;
    if (before === undefined && !this.adopt) return;
    this.adopt = false;
    const file = fileFor(name);
    if (file !== this.file) this.place(this.text, file);
  }

  /** The shareable link of the machine on the bench. */
  link(): string {
    return machineLink(location.href, this.text);
  }

  /** Bring back the text the last replacement put aside (and put the current one aside). */
  restore(): void {
    const p = this.previous;
    if (!p) return;
    this.replace(p.text, p.file, 'Brought back the earlier machine.');
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

  /** Add a sentence to the message showing (an information one keeps its offer to bring the earlier machine back). */
  tell(words: string): void {
    const n = this.notice;
    this.say(n && n.tone === 'info' ? { ...n, words: `${n.words} ${words}` } : { tone: 'info', words });
  }

  private replace(text: string, file: string, words: string, named = false): void {
    if (this.text.trim() !== '' && this.text !== text) this.keepPrevious(this.text, this.file);
    this.dirty = false;
    this.named = named;
    this.adopt = false;
    this.seenName = undefined;
    keepSet('file-named', named ? '1' : '0');
    this.place(text, file, words);
  }

  private keepPrevious(text: string, file: string): void {
    this.previous = { text, file };
    keepSet('previous', JSON.stringify(this.previous));
  }

  private place(given: string, file: string, words?: string): void {
    // The bench holds what its textarea can: a textarea's value has every line break as LF
    // (HTML's "API value" of a textarea), so a text with CRLF or CR breaks (a file saved on
    // another system) is taken with LF. Otherwise the text and the textarea differ, the editor
    // puts the text back on every update, and the edits of the ledger and the sketch cannot
    // go through the textarea's own undo. Lines and columns are the same either way.
    const text = given.replace(/\r\n?/g, '\n');
    this.text = text;
    this.file = file;
    this.rev++;
    const kept = keepSet('text', text);
    keepSet('file', file);
    keepSet('dirty', this.dirty ? '1' : '0');
    if (!kept && !this.unkept)
      this.notice = {
        tone: 'problem',
        words:
          'This browser is not keeping the text (its storage refused it): save the machine to a file before leaving the page.',
      };
    this.unkept = !kept;
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
    markWritten(this.text);
    if (location.hash !== hash) history.replaceState(null, '', hash);
  };

  /** Leaving asks first only when the text would really be lost: the browser refused to keep it. */
  private readonly onLeave = (e: BeforeUnloadEvent): void => {
    this.flushHash();
    if (!this.unkept) return;
    e.preventDefault();
    // Older browsers show the prompt only when returnValue is set.
    e.returnValue = '';
  };

  private readonly onHash = (): void => {
    const linked = machineFromHash(location.hash);
    if (linked === undefined || linked === this.text) return;
    this.replace(linked, UNNAMED, 'Opened the machine carried by the link.');
    this.adopt = true;
  };
}
