/** `settle demo` (not built yet). */
import type { Command } from 'commander';

export function registerDemoCommand(_program: Command): void {
  // Placeholder until the command lands.
}
