/** `settle check` (not built yet). */
import type { Command } from 'commander';

export function registerCheckCommand(_program: Command): void {
  // Placeholder until the command lands.
}
