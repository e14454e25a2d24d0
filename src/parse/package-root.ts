/** Where settle is installed: the nearest folder above this module that holds package.json. Works
 * from src/ (under vitest) and from dist/src/ (built). */
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

let cached: string | undefined;

export function packageRoot(): string {
  if (cached !== undefined) return cached;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    if (existsSync(join(dir, 'package.json'))) return (cached = dir);
    const parent = dirname(dir);
    if (parent === dir) throw new Error(`settle cannot find its package.json above ${fileURLToPath(import.meta.url)}: the installation is incomplete`);
    dir = parent;
  }
}

/** The folder of built-in parser specs and the schema. */
export function builtInParsersDir(): string {
  return join(packageRoot(), 'parsers');
}
