/**
 * Download names of the build documents. Which documents there are, their labels and media
 * types come from the core's documents registry (src/core/export/documents.ts).
 */

/** A download name: the machine's name made safe for a file system, a dash, and the document's file name. */
export function fileName(machine: string, file: string): string {
  const safe = machine.replace(/[^A-Za-z0-9_.-]+/g, '_').replace(/^[._-]+/, '') || 'machine';
  return `${safe}-${file}`;
}
