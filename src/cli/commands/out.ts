/** `build --out DIR`: the build documents, written atomically. */
import { buildDocuments } from '../../core/export/index.js';
import type { Diagnostic } from '../../core/model/diagnostics.js';
import type { Built } from '../../core/pipeline.js';
import { writeBuildFolder } from '../write-out.js';

export function writeDocuments(
  b: Built,
  dir: string,
  force: boolean,
): { ok: true; files: string[] } | { ok: false; diagnostic: Diagnostic } {
  const files = buildDocuments({ build: b.build, checks: b.checks, profile: b.profile, analysed: b.analysed });
  const w = writeBuildFolder(dir, files, { force });
  return w.ok ? { ok: true, files: w.files } : { ok: false, diagnostic: w.diagnostic };
}
