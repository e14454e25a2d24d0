/**
 * Globs on series names, as users write them (`--residual 'res_*'`, spec `kinds`): `*` matches any
 * run of characters, `?` exactly one, everything else itself; the whole name must match.
 * Cost: compiling is O(glob length); matching is one anchored regular-expression test.
 */
export function globMatcher(globs: readonly string[]): (name: string) => boolean {
  if (globs.length === 0) return () => false;
  const regex = new RegExp(`^(?:${globs.map(globToSource).join('|')})$`, 's');
  return (name) => regex.test(name);
}

function globToSource(glob: string): string {
  let out = '';
  for (const c of glob) {
    if (c === '*') out += '.*';
    else if (c === '?') out += '.';
    else out += c.replace(/[\\^$.|+()[\]{}]/g, '\\$&');
  }
  return out;
}
