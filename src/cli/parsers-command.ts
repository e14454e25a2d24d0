/** `settle parsers` (not built yet). */
import type { Command } from 'commander';

export function registerParsersCommand(_program: Command): void {
  // Placeholder until the command lands.
}
