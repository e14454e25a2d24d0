/** `settle watch` (not built yet). */
import type { Command } from 'commander';

export function registerWatchCommand(_program: Command): void {
  // Placeholder until the command lands.
}
