/**
 * The dashboard on a real terminal: a blessed screen with one box per panel, filled from the painted
 * view model by one throttled render loop. Streams are injected (tests pass their own); blessed is
 * loaded lazily, so commands that do not draw never load it.
 *
 * The terminal is always given back: quitting, a failure while drawing, and closing all destroy the
 * screen (which leaves the alternate screen, shows the cursor and turns raw mode off).
 */
import type { Widgets } from 'blessed';
import type { RunDiagnosis } from '../analysis/diagnosis.js';
import type { MonitorPace, RunMonitor } from '../monitor/run-monitor-types.js';
import type { RunSnapshot } from '../series/series-column.js';
import type { SourceEvent } from '../ingest/line-source.js';
import type { DashboardModel, RunViewModel } from './dashboard-model.js';
import { buildHeaderModel, buildViewModel, chartedQuantities, tableOrder } from './build-view-model.js';
import type { RunContext, TerminalSize } from './build-view-model.js';
import { buildOverviewModel, overviewOrder } from './build-overview-model.js';
import type { RunSummary } from './build-overview-model.js';
import { paintDashboard, paintHeader } from './paint-panels.js';
import type { PaintedPanel, PanelName } from './paint-panels.js';
import { toBlessedTags } from './styled-text.js';
import { applyKey, initialViewState } from './view-state.js';
import type { KeyContext, ViewState } from './view-state.js';
import { createRenderLoop, SYSTEM_TIMERS } from './render-loop.js';
import type { Timers } from './render-loop.js';

export interface WatchedRun {
  /** The log path(s), as shown in the header and the overview. */
  readonly label: string;
  readonly monitor: RunMonitor;
}

export interface DashboardOptions {
  readonly runs: readonly WatchedRun[];
  /** Keys come from here (a TTY in real use). */
  readonly input: NodeJS.ReadableStream;
  /** The screen is drawn here; must look like a TTY (columns, rows, isTTY). */
  readonly output: NodeJS.WritableStream;
  /** Environment for TERM and NO_COLOR. Default process.env. */
  readonly env?: NodeJS.ProcessEnv;
  /** Wall clock (ms) for ages in the header. Default Date.now. */
  readonly now?: () => number;
  /** Shortest time between two frames (ms). Default 200 (at most 5 frames a second while data streams;
   * the first change after a quiet spell is drawn at once). */
  readonly frameMs?: number;
  /** Iterations the `recent` span shows. Default 1000. */
  readonly recentIterations?: number;
  readonly timers?: Timers;
}

export interface Dashboard {
  /** Resolves when the person quits; rejects (after the terminal is restored) when drawing failed. */
  readonly done: Promise<void>;
  /** Close the dashboard and restore the terminal. Idempotent. */
  close(): void;
  /** Frames drawn so far (for measurements). */
  frames(): number;
  /** The characters on screen now, one string per row (for tests). */
  text(): string[];
  /** Show news about run `index` (e.g. why its log cannot be read) in its verdict panel. */
  note(index: number, message: string): void;
}

/** The terminal type blessed is told to use: its own terminfo reader cannot parse current ncurses
 * `*-256color` entries, so those map to its bundled xterm-256color, everything else to xterm. */
export function blessedTerminal(term: string | undefined): string {
  return term !== undefined && term.includes('256color') ? 'xterm-256color' : 'xterm';
}

/** Colour unless NO_COLOR is set (https://no-color.org: any non-empty value) or the terminal has
 * fewer than 8 colours. */
export function useColour(env: NodeJS.ProcessEnv, terminalColours: number): boolean {
  if (env.NO_COLOR !== undefined && env.NO_COLOR !== '') return false;
  return terminalColours >= 8;
}

/** A copy of a snapshot that later records cannot change (the store's arrays are shared). */
export function freezeSnapshot(snapshot: RunSnapshot): RunSnapshot {
  return {
    ...snapshot,
    series: snapshot.series.map((column) => ({
      info: column.info,
      iterations: column.iterations.slice(0, column.length),
      values: column.values.slice(0, column.length),
      length: column.length,
      totalAdded: column.totalAdded,
      fullResolutionFrom: column.fullResolutionFrom,
    })),
    restarts: [...snapshot.restarts],
    timeSteps: snapshot.timeSteps?.map((step) => ({ ...step })),
  };
}

interface RunState {
  readonly run: WatchedRun;
  diagnosis: RunDiagnosis;
  note?: string;
  /** Bumped on every data event: frames with unchanged versions only refresh the clock. */
  version: number;
}

interface Frozen {
  readonly diagnosis: RunDiagnosis;
  readonly snapshot: RunSnapshot;
  readonly pace: MonitorPace;
}

function noteOf(event: SourceEvent, label: string): string | undefined | null {
  switch (event.type) {
    case 'waiting':
      return `waiting for ${event.path} to appear`;
    case 'deleted':
      return `${event.path} was deleted; waiting for it to come back`;
    case 'truncated':
      return `${event.path} shrank: reading it again from the top`;
    case 'replaced':
      return `${event.path} was replaced by a new file: reading it from the top`;
    case 'warning':
      return event.message;
    case 'opened':
      return null;
    case 'end':
      return `${label}: no more data (the source ended)`;
    default:
      return undefined;
  }
}

type BlessedModule = typeof import('blessed');

export async function openDashboard(options: DashboardOptions): Promise<Dashboard> {
  const blessed = ((await import('blessed')) as unknown as { default: BlessedModule }).default;
  const env = options.env ?? process.env;
  const now = options.now ?? Date.now;
  const timers = options.timers ?? SYSTEM_TIMERS;
  const runs: RunState[] = options.runs.map((run) => ({ run, diagnosis: run.monitor.diagnosis(), version: 0 }));
  let view: ViewState = initialViewState(runs.length, options.recentIterations);
  let frozen: Frozen[] | undefined;

  // blessed prints terminfo complaints on stderr while it builds the screen: keep them off the
  // person's terminal.
  const screen = withQuietStderr(() => blessed.screen({
    // @types/blessed swaps the input and output stream types: cast each to what the typings expect.
    input: options.input as unknown as Widgets.IScreenOptions['input'],
    output: options.output as unknown as Widgets.IScreenOptions['output'],
    terminal: blessedTerminal(env.TERM),
    smartCSR: true,
    fullUnicode: false,
    // Braille cells, box lines and '·' need UTF-8; without this, blessed guesses from LANG and falls
    // back to the line-drawing character set, which turns them into letters.
    forceUnicode: true,
    autoPadding: false,
    warnings: false,
    title: 'settle watch',
  }));
  // Write UTF-8 line drawing as it is, never through the terminal's alternate character set: one
  // encoding, fewer bytes, and terminal captures read as the screen looks.
  (screen as unknown as { tput: { brokenACS: boolean } }).tput.brokenACS = true;
  const colour = useColour(env, (screen as unknown as { tput?: { colors?: number } }).tput?.colors ?? 8);
  const boxes = new Map<PanelName, Widgets.BoxElement>();
  const placed = new Map<PanelName, string>();
  const contents = new Map<PanelName, string>();
  const tagged = new WeakMap<PaintedPanel, string>();
  let paintedBefore: { model: DashboardModel; panels: Partial<Record<PanelName, PaintedPanel>> } | undefined;
  let last: { model: DashboardModel; key: string } | undefined;
  let closed = false;
  let resolveDone: () => void = () => undefined;
  let rejectDone: (error: unknown) => void = () => undefined;
  const done = new Promise<void>((resolve, reject) => {
    resolveDone = resolve;
    rejectDone = reject;
  });

  const unsubscribe: (() => void)[] = [];
  runs.forEach((state) => {
    const monitor = state.run.monitor;
    const bump = (): void => {
      state.version++;
      loop.invalidate();
    };
    unsubscribe.push(
      monitor.on('records', () => {
        if (state.note !== undefined && state.note.startsWith('waiting')) state.note = undefined;
        bump();
      }),
      monitor.on('diagnosis', (diagnosis) => {
        state.diagnosis = diagnosis;
        bump();
      }),
      monitor.on('preview', (diagnosis) => {
        state.diagnosis = diagnosis;
        bump();
      }),
      monitor.on('end', (diagnosis) => {
        state.diagnosis = diagnosis;
        bump();
      }),
      monitor.on('parser', bump),
      monitor.on('source', (event) => {
        const note = noteOf(event, state.run.label);
        if (note === undefined) return;
        state.note = note ?? undefined;
        bump();
      }),
    );
  });

  function sizeNow(): TerminalSize {
    return { cols: Math.max(1, screen.width as number), rows: Math.max(1, screen.height as number) };
  }

  function dataOf(index: number): Frozen {
    if (frozen !== undefined) return frozen[index];
    const state = runs[index];
    return { diagnosis: state.diagnosis, snapshot: state.run.monitor.store.snapshot(), pace: state.run.monitor.pace() };
  }

  function contextOf(index: number): RunContext {
    const state = runs[index];
    return { label: state.run.label, parser: state.run.monitor.parserChoice()?.id, note: state.note, runCount: runs.length };
  }

  function buildModel(): DashboardModel {
    const size = sizeNow();
    const at = now();
    if (view.mode === 'overview') {
      const summaries: RunSummary[] = runs.map((state, index) => ({ label: state.run.label, ...dataOf(index) }));
      return buildOverviewModel(summaries, view, size, at);
    }
    const index = Math.min(view.runIndex, runs.length - 1);
    const data = dataOf(index);
    // Unchanged data, view and size: only the clock moved, so only the header needs building.
    const key = `${index}|${runs[index].version}|${frozen === undefined}|${size.cols}x${size.rows}|${JSON.stringify({ ...view, hidden: [...view.hidden] })}`;
    if (last !== undefined && last.key === key && last.model.kind === 'run') {
      const model: RunViewModel = { ...last.model, header: buildHeaderModel(data.snapshot, view, data.pace, at, contextOf(index)) };
      last = { model, key };
      return model;
    }
    const model = buildViewModel(data.diagnosis, data.snapshot, view, data.pace, size, at, contextOf(index));
    last = { model, key };
    return model;
  }

  function boxFor(name: PanelName, bordered: boolean): Widgets.BoxElement {
    let box = boxes.get(name);
    if (box === undefined) {
      box = blessed.box({
        parent: screen,
        tags: true,
        wrap: false,
        scrollable: false,
        border: bordered ? { type: 'line' } : undefined,
        style: colour ? { border: { fg: 'blue' }, label: { fg: 'white', bold: true } } : { label: { bold: true } },
      });
      boxes.set(name, box);
    }
    return box;
  }

  function render(): void {
    if (closed) return;
    try {
      const model = buildModel();
      const panels = paintedBefore !== undefined && onlyHeaderDiffers(model, paintedBefore.model) && paintedBefore.panels.header !== undefined
        ? { ...paintedBefore.panels, header: { rect: model.layout.header, lines: [paintHeader((model as RunViewModel).header, model.layout.header.width)] } }
        : paintDashboard(model, colour);
      paintedBefore = { model, panels };
      for (const [name, box] of boxes) if (panels[name] === undefined && box.visible) box.hide();
      for (const [name, panel] of Object.entries(panels) as [PanelName, NonNullable<(typeof panels)[PanelName]>][]) {
        const box = boxFor(name, panel.title !== undefined);
        const { left, top, width, height } = panel.rect;
        // Touch a box only where something changed: blessed re-parses every content it is given.
        const placement = `${left},${top},${width},${height},${panel.title ?? ''}`;
        if (placed.get(name) !== placement) {
          box.left = left;
          box.top = top;
          box.width = width;
          box.height = height;
          if (panel.title !== undefined) box.setLabel(panel.title);
          placed.set(name, placement);
        }
        let content = tagged.get(panel);
        if (content === undefined) {
          content = panel.lines.map((line) => toBlessedTags(line, colour)).join('\n');
          tagged.set(panel, content);
        }
        if (contents.get(name) !== content) {
          box.setContent(content);
          contents.set(name, content);
        }
        if (!box.visible) box.show();
        if (name === 'help') box.setFront();
      }
      screen.render();
    } catch (error) {
      fail(error);
    }
  }

  const loop = createRenderLoop(render, options.frameMs ?? 200, timers);
  // Ages in the header ("grew 4 s ago") move with the clock: one cheap frame a second.
  const clock = setInterval(() => loop.invalidate(), 1000);
  clock.unref?.();

  function keyContext(): KeyContext {
    const index = Math.min(view.runIndex, runs.length - 1);
    const snapshot = dataOf(index).snapshot;
    const summaries: RunSummary[] = runs.map((state, i) => ({ label: state.run.label, ...dataOf(i) }));
    return {
      runCount: runs.length,
      seriesNames: tableOrder(snapshot).map((column) => column.info.name),
      quantityCount: chartedQuantities(snapshot).length,
      overviewOrder: overviewOrder(summaries),
    };
  }

  screen.on('keypress', (ch: string | undefined, key: { full?: string } | undefined) => {
    try {
      const name = key?.full ?? ch;
      if (name === undefined || name === 'return') return;
      const outcome = applyKey(view, name, keyContext());
      if (outcome.quit) {
        close();
        return;
      }
      if (outcome.state === view) return;
      if (outcome.state.paused && !view.paused) frozen = runs.map((_, index) => {
        const data = dataOf(index);
        return { ...data, snapshot: freezeSnapshot(data.snapshot) };
      });
      if (!outcome.state.paused) frozen = undefined;
      view = outcome.state;
      loop.invalidate();
    } catch (error) {
      fail(error);
    }
  });
  screen.on('resize', () => {
    loop.invalidate();
    loop.flush();
  });

  function teardown(): void {
    if (closed) return;
    closed = true;
    loop.stop();
    clearInterval(clock);
    for (const off of unsubscribe) off();
    screen.destroy();
  }

  function close(): void {
    teardown();
    resolveDone();
  }

  function fail(error: unknown): void {
    teardown();
    rejectDone(error);
  }

  loop.invalidate();
  const text = (): string[] => {
    const lines = (screen as unknown as { lines: [unknown, string][][] }).lines;
    return lines.map((row) => row.map((cell) => cell[1]).join(''));
  };
  const note = (index: number, message: string): void => {
    const state = runs[index];
    if (state === undefined) return;
    state.note = message;
    state.version++;
    loop.invalidate();
  };
  return { done, close, frames: () => loop.frames, text, note };
}

/** True when `next` is `previous` with only a new header (the clock moved, nothing else). */
function onlyHeaderDiffers(next: DashboardModel, previous: DashboardModel): boolean {
  if (next.kind !== 'run' || previous.kind !== 'run' || next === previous) return false;
  const keys = Object.keys(next) as (keyof RunViewModel)[];
  return keys.every((key) => key === 'header' || next[key] === previous[key]);
}

function withQuietStderr<T>(action: () => T): T {
  const write = process.stderr.write;
  const error = console.error;
  process.stderr.write = (() => true) as typeof process.stderr.write;
  console.error = () => undefined;
  try {
    return action();
  } finally {
    process.stderr.write = write;
    console.error = error;
  }
}
