import { describe, expect, it } from 'vitest';
import { applyKey, initialViewState, KEY_HELP } from '../../src/ui/view-state.js';
import type { KeyContext, ViewState } from '../../src/ui/view-state.js';

const context: KeyContext = { runCount: 3, seriesNames: ['res_p', 'res_u', 'nu_hot'], quantityCount: 2, overviewOrder: [2, 0, 1] };
const run = (changes: Partial<ViewState> = {}): ViewState => ({ ...initialViewState(3), mode: 'run', ...changes });

describe('applyKey', () => {
  it('opens on the overview with several runs and on the run with one', () => {
    expect(initialViewState(3).mode).toBe('overview');
    expect(initialViewState(1).mode).toBe('run');
  });

  it.each(['q', 'C-c'])('%s quits, even with the help open', (key) => {
    expect(applyKey(run(), key, context).quit).toBe(true);
    expect(applyKey(run({ help: true }), key, context).quit).toBe(true);
  });

  it.each([
    ['?', {}, { help: true }],
    ['space', {}, { paused: true }],
    ['p', { paused: true }, { paused: false }],
    ['r', {}, { span: 'recent' }],
    ['r', { span: 'recent' }, { span: 'all' }],
    [']', {}, { quantityIndex: 1 }],
    [']', { quantityIndex: 1 }, { quantityIndex: 0 }],
    ['[', {}, { quantityIndex: 1 }],
    ['down', {}, { seriesCursor: 1 }],
    ['j', { seriesCursor: 2 }, { seriesCursor: 2 }],
    ['up', {}, { seriesCursor: 0 }],
    ['k', { seriesCursor: 2 }, { seriesCursor: 1 }],
    ['o', {}, { mode: 'overview' }],
    ['escape', {}, { mode: 'overview' }],
  ] as [string, Partial<ViewState>, Partial<ViewState>][])('in a run, %s turns %j into %j', (key, before, after) => {
    const outcome = applyKey(run(before), key, context);
    expect(outcome.quit).toBe(false);
    expect(outcome.state).toEqual(run({ ...before, ...after }));
  });

  it('h hides and shows the series under the cursor; a shows all again', () => {
    const hidden = applyKey(run({ seriesCursor: 1 }), 'h', context).state;
    expect([...hidden.hidden]).toEqual(['res_u']);
    expect([...applyKey(hidden, 'h', context).state.hidden]).toEqual([]);
    expect([...applyKey(hidden, 'a', context).state.hidden]).toEqual([]);
  });

  it('moves the overview cursor in the sorted order and opens the run under it', () => {
    const overview = initialViewState(3);
    // Until moved, the cursor is on the worst run: the first in overviewOrder (run 2).
    expect(applyKey(overview, 'enter', context).state.runIndex).toBe(2);
    const down = applyKey(overview, 'down', context).state;
    expect(down.runIndex).toBe(0);
    expect(applyKey(down, 'down', context).state.runIndex).toBe(1);
    expect(applyKey(overview, 'up', context).state.runIndex).toBe(2);
    expect(applyKey(down, 'up', context).state.runIndex).toBe(2);
    const opened = applyKey(down, 'enter', context).state;
    expect(opened.mode).toBe('run');
    expect(opened.runIndex).toBe(0);
  });

  it('any key closes the help; unknown keys and keys that do not apply change nothing', () => {
    expect(applyKey(run({ help: true }), 'x', context).state.help).toBe(false);
    const state = run();
    expect(applyKey(state, 'x', context).state).toBe(state);
    expect(applyKey(state, 'enter', context).state).toBe(state);
    const single = initialViewState(1);
    expect(applyKey(single, 'o', { ...context, runCount: 1 }).state).toBe(single);
  });

  it('lists every key it answers to in the help', () => {
    const listed = KEY_HELP.map((entry) => entry.keys).join(' ');
    for (const key of ['?', 'space', 'p', 'r', ']', '[', 'up', 'down', 'k', 'j', 'h', 'a', 'enter', 'o', 'escape', 'q', 'ctrl-c']) expect(listed).toContain(key);
  });
});
