/**
 * Parse the gate's `--signal PID[:SIGNAL]` value into a process id and a signal name. The signal
 * defaults to SIGTERM; names are accepted with or without the `SIG` prefix, in any case, and must be
 * in the table of signals the platform knows (passed in, so this stays pure: the caller gives
 * `os.constants.signals`). Pure; O(length of the text).
 *
 * @example parseSignalTarget('4242:usr1', { SIGUSR1: 10, SIGTERM: 15 }) // { pid: 4242, signal: 'SIGUSR1' }
 */
import { UsageError, shorten } from '../errors.js';
import { parseProcessId } from './parse-process-id.js';

export interface SignalTarget {
  readonly pid: number;
  /** Upper-case name with the SIG prefix, e.g. `SIGUSR1`. */
  readonly signal: string;
}

export const DEFAULT_SIGNAL = 'SIGTERM';

export function parseSignalTarget(text: string, knownSignals: Readonly<Record<string, number>>): SignalTarget {
  const colon = text.indexOf(':');
  const pidText = colon < 0 ? text : text.slice(0, colon);
  const pid = parseProcessId('--signal', pidText, `for example --signal 4242 or --signal 4242:SIGUSR1`);
  if (colon < 0) return { pid, signal: DEFAULT_SIGNAL };
  const raw = text.slice(colon + 1).trim().toUpperCase();
  const signal = raw.startsWith('SIG') ? raw : `SIG${raw}`;
  if (raw === '' || !Object.hasOwn(knownSignals, signal)) {
    const some = ['SIGTERM', 'SIGINT', 'SIGUSR1', 'SIGUSR2', 'SIGHUP'].filter((name) => Object.hasOwn(knownSignals, name));
    throw new UsageError(`--signal names a signal that does not exist: '${shorten(text.slice(colon + 1), 20)}'`,
      `use a signal name such as ${some.join(', ')} (see 'kill -l')`);
  }
  return { pid, signal };
}
