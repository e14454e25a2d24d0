/**
 * What the person at the keyboard has chosen to see, and how each key changes it. Pure: the screen
 * shell feeds key names in and redraws from the state that comes out.
 */

export interface ViewState {
  /** `overview`: the table of runs (several logs); `run`: one run's dashboard. */
  readonly mode: 'overview' | 'run';
  /** The run shown in `run` mode, and the highlighted row in `overview` mode (index into the runs as listed). */
  readonly runIndex: number;
  /** False until the person moves the overview cursor: until then it stays on the worst run. */
  readonly runChosen: boolean;
  /** Frozen view: data keeps arriving, the screen keeps the moment the pause began. */
  readonly paused: boolean;
  /** Charts show the last `recentIterations` iterations, or the whole history. */
  readonly span: 'recent' | 'all';
  readonly recentIterations: number;
  /** Which monitored quantity the quantity chart shows (index among quantities, wraps). */
  readonly quantityIndex: number;
  /** Highlighted row of the series table (index among all series). */
  readonly seriesCursor: number;
  /** Series names hidden from the charts (still listed in the table). */
  readonly hidden: ReadonlySet<string>;
  readonly help: boolean;
}

export function initialViewState(runCount: number, recentIterations = 1000): ViewState {
  return {
    mode: runCount > 1 ? 'overview' : 'run',
    runIndex: 0,
    runChosen: false,
    paused: false,
    span: 'all',
    recentIterations,
    quantityIndex: 0,
    seriesCursor: 0,
    hidden: new Set(),
    help: false,
  };
}

/** What the keys can reach right now: sizes of the lists they move through. */
export interface KeyContext {
  readonly runCount: number;
  /** Series names of the run shown, in table order. */
  readonly seriesNames: readonly string[];
  readonly quantityCount: number;
  /** Overview rows are sorted worst first: row r shows run `overviewOrder[r]`. */
  readonly overviewOrder: readonly number[];
}

/** One entry of the help overlay: the keys and what they do. */
export interface KeyHelp {
  readonly keys: string;
  readonly action: string;
}

/** Every key the dashboard answers to (the help overlay lists these, in this order). */
export const KEY_HELP: readonly KeyHelp[] = [
  { keys: '?', action: 'show or hide this help' },
  { keys: 'space  p', action: 'pause or resume the view (reading goes on)' },
  { keys: 'r', action: 'charts: recent iterations or the whole history' },
  { keys: ']  [', action: 'next or previous monitored quantity' },
  { keys: 'up down  k j', action: 'move the series cursor (overview: the run cursor)' },
  { keys: 'h', action: 'hide or show the series under the cursor' },
  { keys: 'a', action: 'show every series again' },
  { keys: 'enter', action: 'open the run under the cursor (overview)' },
  { keys: 'o  escape  backspace', action: 'back to the overview of runs' },
  { keys: 'q  ctrl-c', action: 'quit' },
];

export type KeyOutcome = { readonly state: ViewState; readonly quit: boolean };

const wrap = (value: number, count: number): number => (count <= 0 ? 0 : ((value % count) + count) % count);
const clamp = (value: number, count: number): number => Math.max(0, Math.min(Math.max(0, count - 1), value));

/** The state after `key` (a blessed key name: `q`, `?`, `up`, `enter`, `C-c`...). Unknown keys change
 * nothing. While help is shown, any key closes it (and `q` still quits). */
export function applyKey(state: ViewState, key: string, context: KeyContext): KeyOutcome {
  const same = { state, quit: false };
  const next = (changes: Partial<ViewState>): KeyOutcome => ({ state: { ...state, ...changes }, quit: false });
  if (key === 'q' || key === 'C-c') return { state, quit: true };
  if (state.help) return next({ help: false });
  switch (key) {
    case '?':
      return next({ help: true });
    case 'space':
    case 'p':
      return next({ paused: !state.paused });
    case 'r':
      return next({ span: state.span === 'all' ? 'recent' : 'all' });
    case ']':
      return state.mode === 'run' ? next({ quantityIndex: wrap(state.quantityIndex + 1, context.quantityCount) }) : same;
    case '[':
      return state.mode === 'run' ? next({ quantityIndex: wrap(state.quantityIndex - 1, context.quantityCount) }) : same;
    case 'up':
    case 'k':
    case 'down':
    case 'j': {
      const step = key === 'up' || key === 'k' ? -1 : 1;
      if (state.mode === 'overview') {
        const row = context.overviewOrder.indexOf(cursorRun(state, context));
        const target = context.overviewOrder[clamp(row + step, context.overviewOrder.length)];
        return target === undefined ? same : next({ runIndex: target, runChosen: true });
      }
      return next({ seriesCursor: clamp(state.seriesCursor + step, context.seriesNames.length) });
    }
    case 'h': {
      if (state.mode !== 'run') return same;
      const name = context.seriesNames[state.seriesCursor];
      if (name === undefined) return same;
      const hidden = new Set(state.hidden);
      if (hidden.has(name)) hidden.delete(name);
      else hidden.add(name);
      return next({ hidden });
    }
    case 'a':
      return state.hidden.size === 0 ? same : next({ hidden: new Set() });
    case 'enter':
      return state.mode === 'overview' && context.runCount > 0
        ? next({ mode: 'run', runIndex: cursorRun(state, context), runChosen: true, seriesCursor: 0, quantityIndex: 0, hidden: new Set() })
        : same;
    case 'o':
    case 'escape':
    case 'backspace':
      return state.mode === 'run' && context.runCount > 1 ? next({ mode: 'overview' }) : same;
    default:
      return same;
  }
}

/** The run under the overview cursor: the worst run (first row) until the person moves the cursor. */
export function cursorRun(state: ViewState, context: Pick<KeyContext, 'overviewOrder'>): number {
  if (!state.runChosen && context.overviewOrder.length > 0) return context.overviewOrder[0];
  return state.runIndex;
}
