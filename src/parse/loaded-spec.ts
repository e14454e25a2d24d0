/** A parser spec as loaded: where it came from, and its validated content. */
import type { ParserSpec } from './parser-spec.js';

export interface LoadedSpec {
  readonly id: string;
  /** Absolute path of the file it was read from. */
  readonly file: string;
  /** Shipped with settle (top-level parsers/ folder), rather than the user's. */
  readonly builtIn: boolean;
  readonly description: string;
  readonly spec: ParserSpec;
}
