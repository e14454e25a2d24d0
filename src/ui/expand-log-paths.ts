/**
 * Turn what the person typed after `settle watch` into log files: a file stays as it is (it may not
 * exist yet: the monitor waits for it), a folder becomes the logs in it (hidden files left out), and
 * a quoted glob (`*` and `?` in any path segment, no `**`) becomes the files it matches. Reads
 * directories only.
 */
import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { UsageError } from '../errors.js';
import { globMatcher } from '../text/glob.js';

/** Names a folder's logs may have (plain or gzip-compressed). */
export const LOG_FILE_PATTERN = /\.(log|out|txt|csv|jsonl|dat)(\.gz)?$/i;

const hasWildcard = (text: string): boolean => /[*?]/.test(text);

function isDirectory(file: string): boolean {
  try {
    return statSync(file).isDirectory();
  } catch {
    return false;
  }
}

function isFile(file: string): boolean {
  try {
    return statSync(file).isFile();
  } catch {
    return false;
  }
}

function listDirectory(directory: string): string[] {
  try {
    return readdirSync(directory).sort();
  } catch {
    return [];
  }
}

/** Files matching `pattern`, segment by segment, sorted. */
export function expandGlob(pattern: string): string[] {
  const absolute = path.isAbsolute(pattern);
  const segments = pattern.split(/[\\/]+/).filter((segment) => segment !== '');
  let current: string[] = [absolute ? path.parse(path.resolve(pattern)).root : '.'];
  segments.forEach((segment, index) => {
    const lastSegment = index === segments.length - 1;
    const next: string[] = [];
    for (const base of current) {
      if (!hasWildcard(segment)) {
        const candidate = base === '.' && !absolute ? segment : path.join(base, segment);
        if (lastSegment ? isFile(candidate) : isDirectory(candidate)) next.push(candidate);
        continue;
      }
      const matches = globMatcher([segment]);
      for (const name of listDirectory(base)) {
        if (name.startsWith('.') && !segment.startsWith('.')) continue;
        if (!matches(name)) continue;
        const candidate = base === '.' && !absolute ? name : path.join(base, name);
        if (lastSegment ? isFile(candidate) : isDirectory(candidate)) next.push(candidate);
      }
    }
    current = next;
  });
  return current.sort();
}

/** The log files to watch, in the order given (folders and globs sorted by name), without repeats. */
export function expandLogPaths(inputs: readonly string[]): string[] {
  if (inputs.length === 0) throw new UsageError('settle watch needs at least one log', 'for example: settle watch case/run.log');
  const out: string[] = [];
  for (const input of inputs) {
    if (input === '-') {
      out.push(input);
    } else if (hasWildcard(input) && !isFile(input)) {
      const matches = expandGlob(input);
      if (matches.length === 0) throw new UsageError(`no file matches '${input}'`, 'check the pattern (settle expands * and ? itself when quoted)');
      out.push(...matches);
    } else if (isDirectory(input)) {
      const logs = listDirectory(input).filter((name) => !name.startsWith('.') && LOG_FILE_PATTERN.test(name)).map((name) => path.join(input, name)).filter(isFile);
      if (logs.length === 0) throw new UsageError(`folder '${input}' holds no logs`, 'settle looks for *.log, *.out, *.txt, *.csv, *.jsonl and *.dat files (also .gz); name the files instead');
      out.push(...logs);
    } else {
      out.push(input);
    }
  }
  const unique = [...new Set(out)];
  if (unique.filter((file) => file === '-').length > 0 && unique.length > 1) {
    throw new UsageError('standard input (-) cannot be watched together with other logs', 'watch the piped log alone, or write it to a file first');
  }
  return unique;
}
