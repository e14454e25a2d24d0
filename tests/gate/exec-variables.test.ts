/** The --exec environment: the plan sets exactly the variables `settle check --help` lists (one list,
 * src/gate/exec-variables.ts), and a command actually sees all of them. */
import { describe, expect, it } from 'vitest';
import { Command } from 'commander';
import { FINAL_STATES } from '../../src/analysis/diagnosis.js';
import { EXEC_VARIABLE_MEANINGS, EXEC_VARIABLES } from '../../src/gate/exec-variables.js';
import { planGateActions } from '../../src/gate/plan-gate-actions.js';
import { registerCheckCommand } from '../../src/cli/check-command.js';
import { makeDiagnosis } from './make-diagnosis.js';

function checkHelp(): string {
  const program = new Command('settle');
  registerCheckCommand(program);
  const check = program.commands.find((c) => c.name() === 'check') as Command;
  let text = '';
  check.configureOutput({ writeOut: (chunk) => { text += chunk; } });
  check.outputHelp();
  return text;
}

describe('the --exec environment', () => {
  it('is the six variables, each with a meaning', () => {
    expect([...EXEC_VARIABLES]).toEqual(['SETTLE_VERDICT', 'SETTLE_REASON', 'SETTLE_ADVICE', 'SETTLE_LOG', 'SETTLE_EXIT_CODE', 'SETTLE_ITERATION']);
    expect(Object.keys(EXEC_VARIABLE_MEANINGS).sort()).toEqual([...EXEC_VARIABLES].sort());
  });

  it('is what the plan sets, no more and no fewer', () => {
    const plan = planGateActions(makeDiagnosis({ verdict: 'stalled', iterations: 900 }), { kind: 'final' },
      { log: 'run.log', on: FINAL_STATES, minIterations: 10, exec: 'true' });
    const exec = plan.actions.find((action) => action.kind === 'exec');
    expect(exec?.kind).toBe('exec');
    expect(Object.keys(exec?.kind === 'exec' ? exec.env : {}).sort()).toEqual([...EXEC_VARIABLES].sort());
  });

  it('is listed whole in settle check --help: in the --exec option and with meanings after the options', () => {
    const help = checkHelp();
    const execLine = help.slice(help.indexOf('--exec <command>'), help.indexOf('--on <verdicts>')).replace(/\s+/g, ' ');
    for (const name of EXEC_VARIABLES) {
      expect(execLine).toContain(name);
      expect(help).toMatch(new RegExp(`^ {2}${name} +${EXEC_VARIABLE_MEANINGS[name].replace(/[().]/g, '\\$&')}$`, 'm'));
    }
  });
});
