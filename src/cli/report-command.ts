/** `settle report` (not built yet). */
import type { Command } from 'commander';

export function registerReportCommand(_program: Command): void {
  // Placeholder until the command lands.
}
