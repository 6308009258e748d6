/**
 * Build documents for download, made in the worker from the checked build by the core's
 * documents registry; each document is made on its first request, and the pieces several
 * documents share (the commissioning run, the Verilog pair) once per build. Two more things
 * are made from the same documents: the build sheet made ready to print, and one zip archive
 * (PKWARE APPNOTE .ZIP format, written by fflate) holding every document of the registry, and
 * the files the build was made from besides the machine (the workshop's profile, when it is not
 * the shipped defaults).
 */
import { strToU8, zipSync } from 'fflate';
import {
  DOCUMENT_MAKERS,
  DOCUMENT_REGISTRY,
  documentByFile,
  documentSources,
  type Built,
  type DocumentSources,
} from '../../core/index.js';
import { fileName } from './documents.js';
import { ALL_DOCUMENTS, PRINT_SHEET, type ExportFile } from './protocol.js';

const sources = new WeakMap<Built, DocumentSources>();
const made = new WeakMap<Built, Map<string, string>>();

/** The sources of a checked build's documents, made once (the documents and the shakedown walk share them). */
export function sourcesFor(b: Built): DocumentSources {
  let s = sources.get(b);
  if (!s) sources.set(b, (s = documentSources(b)));
  return s;
}

/** The text of one registered document of a checked build, made once. */
function documentText(b: Built, file: string): string {
  const doc = documentByFile(file);
  if (!doc) throw new Error(`no document called '${file}'`);
  let docs = made.get(b);
  if (!docs) made.set(b, (docs = new Map<string, string>()));
  let text = docs.get(doc.file);
  if (text === undefined) {
    docs.set(doc.file, (text = DOCUMENT_MAKERS[doc.name](sourcesFor(b))));
  }
  return text;
}

/** An SVG document as an element to put inside an HTML page (its XML declaration left out). */
const inlineSvg = (svg: string): string => svg.replace(/^<\?xml[^>]*\?>\s*/, '');

const DRAWINGS_CSS = `
figure.drawing { margin: 1rem 0; }
figure.drawing svg { display: block; max-width: 100%; height: auto; }
figure.drawing figcaption { color: #50575e; font-size: .9rem; }
@media print { figure.drawing { break-before: page; break-inside: avoid; } figure.drawing svg { max-height: 240mm; } }
`;

/** A drawing in a sheet: an SVG inline, or embedded as an image whose source is the SVG (a data: URL). */
export const HAS_DRAWING = /<svg[\s>]|<img src="data:image\/svg\+xml/;

/**
 * The build sheet to print: the sheet exactly as the registry makes it. A sheet that carries no
 * drawing of its own gets the state diagram and the schematic added at its end, one page each,
 * so the printed sheet always has its pictures.
 */
export function printSheet(b: Built): string {
  const sheet = documentText(b, 'build-sheet.html');
  if (HAS_DRAWING.test(sheet)) return sheet;
  const figure = (file: string, caption: string): string =>
    `<figure class="drawing">${inlineSvg(documentText(b, file))}<figcaption>${caption}</figcaption></figure>`;
  const drawings = [
    '<section id="drawings">',
    '<h2>Drawings</h2>',
    figure('state-diagram.svg', 'The state diagram: every state with its code, every transition with its guard.'),
    figure('schematic.svg', 'The schematic: every part and cord, left to right through one clock.'),
    '</section>',
  ].join('\n');
  return sheet.replace('</style>', `${DRAWINGS_CSS}</style>`).replace('</body>', `${drawings}\n</body>`);
}

/** Every document of the registry in one zip archive, each under its download name; `extra`: more files, by name. */
export function documentsZip(b: Built, extra: Readonly<Record<string, string>> = {}): Uint8Array {
  const files: Record<string, Uint8Array> = {};
  for (const d of DOCUMENT_REGISTRY) files[fileName(b.build.machine.name, d.file)] = strToU8(documentText(b, d.file));
  for (const [name, text] of Object.entries(extra)) files[name] = strToU8(text);
  return zipSync(files, { level: 6 });
}

/**
 * One document of a checked build: a registered one by its file name, the sheet to print, or the
 * archive of all (with the `extra` files, by name).
 */
export function exportFile(b: Built, file: string, extra: Readonly<Record<string, string>> = {}): ExportFile {
  const machine = b.build.machine.name;
  if (file === PRINT_SHEET)
    return { name: fileName(machine, 'build-sheet.html'), mime: 'text/html', text: printSheet(b) };
  if (file === ALL_DOCUMENTS)
    return { name: fileName(machine, 'documents.zip'), mime: 'application/zip', bytes: documentsZip(b, extra) };
  const doc = documentByFile(file);
  if (!doc) throw new Error(`no document called '${file}'`);
  return { name: fileName(machine, doc.file), mime: doc.mime, text: documentText(b, doc.file) };
}
