/** `settle compare` (not built yet). */
import type { Command } from 'commander';

export function registerCompareCommand(_program: Command): void {
  // Placeholder until the command lands.
}
