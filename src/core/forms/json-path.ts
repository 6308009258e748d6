/** JSON paths as every reader writes them: `$.a.b` for plain keys, `$.a["odd key"]` otherwise, `[i]` for items. */

/** The path of member `key` of the object at `path`. */
export function jsonKey(path: string, key: string): string {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(key) ? `${path}.${key}` : `${path}[${JSON.stringify(key)}]`;
}
