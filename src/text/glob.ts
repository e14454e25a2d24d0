/**
 * Globs on names, as users write them (`--series 'res_*'`, `perSeries[].pattern`, spec `kinds`):
 * `*` matches any run of characters (none included), `?` exactly one character (one Unicode code
 * point), everything else matches itself (regular-expression metacharacters included); the whole
 * name must match.
 *
 * Pure and stateless: compile once where the globs are known (`compileGlob`, `globMatcher`) and keep
 * the returned test; nothing is cached here.
 * Cost: compiling is O(glob length); matching is one anchored regular-expression test.
 *
 * @example compileGlob('res_*')('res_p') // → true
 * @example globMatcher(['Ux', 'res_?'])('res_T') // → true
 */

/** A test for one glob. */
export function compileGlob(glob: string): (name: string) => boolean {
  const regex = new RegExp(`^${globToSource(glob)}$`, 'su');
  return (name) => regex.test(name);
}

/** A test that is true when a name matches any of the globs (false for every name when there are
 * none). Used by parser specs (kinds), --residual/--quantity, criteria and log-path globs. */
export function globMatcher(globs: readonly string[]): (name: string) => boolean {
  if (globs.length === 0) return () => false;
  const regex = new RegExp(`^(?:${globs.map(globToSource).join('|')})$`, 'su');
  return (name) => regex.test(name);
}

/** Regular-expression source of a glob (unanchored). */
function globToSource(glob: string): string {
  let out = '';
  for (const c of glob) {
    if (c === '*') out += '.*';
    else if (c === '?') out += '.';
    else out += c.replace(/[\\^$.|+()[\]{}]/g, '\\$&');
  }
  return out;
}
