/**
 * `settle compare FINE MEDIUM COARSE --quantity NAME --cells N1,N2,N3 [--dims 2|3] [--json]
 * [--allow-unsettled]`: a three-grid mesh study. Reads each run to its end, takes the settled mean of
 * the quantity (refusing unsettled runs unless --allow-unsettled), and computes the Grid Convergence
 * Index by the procedure of Celik et al. (2008), with the iteration error set against the
 * discretisation error. Flags are checked before any log is read.
 *
 * `--quantity` is the source option of the same name: naming the study's quantity also makes settle
 * treat that series as a monitored quantity. Here it must be given exactly once, with a plain name.
 */
import type { Command } from 'commander';
import type { Criteria } from '../analysis/criteria.js';
import type { RunDiagnosis } from '../analysis/diagnosis.js';
import { UsageError } from '../errors.js';
import type { MeshStudy } from '../report/mesh-study.js';
import { addSourceOptions, refusePollOption, runReadingOf, type RunReading, type SourceOptions } from './common-options.js';
import { checkLogsReadable, postMortemMonitor } from './read-run.js';
import { addCriteriaOptions, criteriaFromOptions } from './criteria-options.js';

export interface RunCompareOptions extends RunReading {
  readonly logs: readonly string[];
  readonly quantity: string;
  readonly cells: readonly number[];
  readonly dimensions: 1 | 2 | 3;
  readonly allowUnsettled: boolean;
  readonly json: boolean;
  readonly criteria: Criteria;
  readonly stdout: NodeJS.WritableStream;
}

/** The study quantity from the --quantity values: exactly one plain name. */
export function studyQuantityOf(values: readonly string[]): string {
  if (values.length === 0) throw new UsageError('compare needs --quantity NAME: the quantity the mesh study is about', 'for example --quantity nu_hot (settle inspect LOG lists the series)');
  if (values.length > 1) throw new UsageError(`compare studies one quantity, got --quantity ${values.join(', ')}`, 'give --quantity once; run compare again for another quantity');
  const name = values[0].trim();
  if (name === '' || /[*?]/.test(name)) throw new UsageError(`--quantity needs the name of one series here, got '${values[0]}'`, 'for example --quantity nu_hot');
  return name;
}

export async function runCompare(options: RunCompareOptions): Promise<MeshStudy> {
  if (options.logs.length !== 3) {
    throw new UsageError(`compare takes three logs (fine, medium, coarse), got ${options.logs.length}`, 'for example settle compare fine.log medium.log coarse.log --quantity nu_hot --cells 64000,8000,1000');
  }
  if (options.logs.includes('-')) throw new UsageError('compare reads three log files; standard input (-) is not one of them', 'save each run\'s log to a file first');
  checkLogsReadable(options.logs);
  const { meshStudy } = await import('../report/mesh-study.js');
  const diagnoses: RunDiagnosis[] = [];
  for (const log of options.logs) {
    const monitor = await postMortemMonitor(log, options, options.criteria);
    diagnoses.push(await monitor.run());
  }
  const study = meshStudy(options.logs.map((log, i) => ({ log, cells: options.cells[i], diagnosis: diagnoses[i] })), options.quantity, options.dimensions, options.allowUnsettled);
  const { renderMeshStudyText, meshStudyJson } = await import('../report/render-mesh-study.js');
  options.stdout.write(options.json ? `${JSON.stringify(meshStudyJson(study))}\n` : renderMeshStudyText(study));
  return study;
}


type CompareFlags = SourceOptions & Record<string, unknown> & { cells?: string; dims?: string; json?: boolean; allowUnsettled?: boolean };

export function registerCompareCommand(program: Command): void {
  const command = program
    .command('compare')
    .description('mesh study: the grid convergence index (Celik et al. 2008) of one quantity from a fine, a medium and a coarse run')
    .argument('<log...>', 'three logs: fine, medium, coarse')
    .option('--cells <counts>', 'cell counts of the three grids, comma-separated, fine to coarse (e.g. 64000,8000,1000)')
    .option('--dims <d>', 'dimensions of the grids: 2 or 3 (default 3)')
    .option('--json', 'print one JSON object')
    .option('--allow-unsettled', 'use the last value of a quantity that has not settled (and say so) instead of refusing');
  addCriteriaOptions(refusePollOption(addSourceOptions(command)));
  // The source option --quantity names the study's quantity here: reword its help, drop its default.
  const quantityOption = command.options.find((option) => option.long === '--quantity');
  if (quantityOption !== undefined) {
    quantityOption.flags = '--quantity <name>';
    quantityOption.description = 'the quantity the mesh study is about (required; also treated as a monitored quantity)';
    quantityOption.defaultValue = undefined;
    quantityOption.argParser((value: string, previous: string[] | undefined) => [...(previous ?? []), value]);
  }
  command.action(async (logs: string[], flags: CompareFlags) => {
    const { parseCellCounts, parseDimensions } = await import('../report/mesh-study.js');
    const quantity = studyQuantityOf(flags.quantity ?? []);
    flags.quantity = [quantity];
    if (flags.cells === undefined) throw new UsageError('compare needs --cells N1,N2,N3: the cell counts of the grids, fine to coarse', 'for example --cells 64000,8000,1000');
    const cells = parseCellCounts(flags.cells, logs.length);
    const dimensions = parseDimensions(flags.dims);
    await runCompare({
      logs, quantity, cells, dimensions, allowUnsettled: flags.allowUnsettled === true, json: flags.json === true,
      criteria: criteriaFromOptions(flags), ...runReadingOf(flags), stdout: process.stdout,
    });
  });
}
