/** `build --out DIR`: every document of the core's documents registry, written atomically. */
import { buildDocuments, type Built, type Diagnostic } from '../../core/index.js';
import { writeBuildFolder } from '../write-out.js';

export function writeDocuments(
  b: Built,
  dir: string,
  force: boolean,
): { ok: true; files: string[] } | { ok: false; diagnostic: Diagnostic } {
  const files = buildDocuments({
    build: b.build,
    checks: b.checks,
    profile: b.profile,
    analysed: b.analysed,
    placement: b.placement,
  });
  const w = writeBuildFolder(dir, files, { force });
  return w.ok ? { ok: true, files: w.files } : { ok: false, diagnostic: w.diagnostic };
}
