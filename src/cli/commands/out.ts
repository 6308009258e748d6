/** `build --out DIR`: every document of the core's documents registry, written atomically. */
import { type Built, type Diagnostic, documentSources, documentsOf, type DocumentSources } from '../../core/index.js';
import { writeBuildFolder } from '../write-out.js';

/** The sources of a build's documents (made once; the report reads the commissioning sheet's coverage from them). */
export function sourcesOf(b: Built): DocumentSources {
  return documentSources({
    build: b.build,
    checks: b.checks,
    profile: b.profile,
    analysed: b.analysed,
    placement: b.placement,
  });
}

export function writeDocuments(
  sources: DocumentSources,
  dir: string,
  force: boolean,
): { ok: true; files: string[]; notes: Diagnostic[] } | { ok: false; diagnostic: Diagnostic } {
  return writeBuildFolder(dir, documentsOf(sources), { force });
}
