/** `settle inspect` (not built yet). */
import type { Command } from 'commander';

export function registerInspectCommand(_program: Command): void {
  // Placeholder until the command lands.
}
