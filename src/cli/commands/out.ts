/** `build --out DIR`: every document of the core's documents registry, written atomically. */
import { buildDocuments, type Built, type Diagnostic } from '../../core/index.js';
import { writeBuildFolder } from '../write-out.js';

export function writeDocuments(
  b: Built,
  dir: string,
  force: boolean,
): { ok: true; files: string[]; notes: Diagnostic[] } | { ok: false; diagnostic: Diagnostic } {
  const files = buildDocuments({
    build: b.build,
    checks: b.checks,
    profile: b.profile,
    analysed: b.analysed,
    placement: b.placement,
  });
  return writeBuildFolder(dir, files, { force });
}
