/**
 * A one-line progress bar on a terminal stream while a long log is read post mortem. Shown only when
 * the stream is a TTY and the input is big enough to take a noticeable time; redrawn at most every
 * `intervalMs`; wiped when done so the report (or the next prompt) starts on a clean line.
 */

export interface ProgressStream {
  readonly isTTY?: boolean;
  readonly columns?: number;
  write(text: string): boolean;
}

export interface ProgressBarOptions {
  /** Inputs smaller than this show no bar (default 32 MiB: read in a fraction of a second). */
  readonly minTotalBytes?: number;
  /** Least time between redraws (default 100 ms). */
  readonly intervalMs?: number;
  /** Clock, injected for tests. Default Date.now. */
  readonly now?: () => number;
}

export const PROGRESS_MIN_BYTES = 32 * 1024 * 1024;

function megabytes(bytes: number): string {
  const mb = bytes / 1e6;
  return mb >= 100 ? mb.toFixed(0) : mb.toFixed(1);
}

/** The bar's text for a terminal `columns` wide (no control characters). */
export function formatProgressLine(label: string, bytesRead: number, totalBytes: number, columns: number): string {
  const fraction = totalBytes > 0 ? Math.min(1, Math.max(0, bytesRead / totalBytes)) : 0;
  const percent = `${Math.floor(fraction * 100)}`.padStart(3);
  const tail = ` ${percent} %  ${megabytes(bytesRead)} / ${megabytes(totalBytes)} MB`;
  const room = Math.max(10, columns - 1);
  const barWidth = Math.max(10, Math.min(40, room - tail.length - 12));
  const filled = Math.round(fraction * barWidth);
  const bar = `[${'#'.repeat(filled)}${'-'.repeat(barWidth - filled)}]`;
  const labelRoom = Math.max(0, room - bar.length - tail.length - 10);
  const shortLabel = label.length <= labelRoom ? label : `…${label.slice(label.length - Math.max(0, labelRoom - 1))}`;
  return `reading ${shortLabel} ${bar}${tail}`.slice(0, room);
}

export interface ProgressBar {
  update(bytesRead: number, totalBytes: number): void;
  /** Wipe the bar (if drawn). Idempotent. */
  finish(): void;
}

export function createProgressBar(stream: ProgressStream, label: string, options: ProgressBarOptions = {}): ProgressBar {
  const minTotal = options.minTotalBytes ?? PROGRESS_MIN_BYTES;
  const interval = options.intervalMs ?? 100;
  const now = options.now ?? Date.now;
  let drawn = false;
  let lastDraw = Number.NEGATIVE_INFINITY;
  return {
    update(bytesRead, totalBytes) {
      if (!stream.isTTY || !(totalBytes >= minTotal)) return;
      const t = now();
      if (t - lastDraw < interval && bytesRead < totalBytes) return;
      lastDraw = t;
      drawn = true;
      stream.write(`\r${formatProgressLine(label, bytesRead, totalBytes, stream.columns ?? 80)}\x1b[K`);
    },
    finish() {
      if (drawn) stream.write('\r\x1b[K');
      drawn = false;
    },
  };
}
