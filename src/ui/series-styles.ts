/**
 * How series and states look: a colour and an ASCII marker per series (markers tell series apart on
 * a monochrome terminal or with NO_COLOR), and a style per state. Our own choices: green is good,
 * red is bad, yellow and magenta ask for attention; residuals and quantities cycle through the rest.
 */
import type { State } from '../analysis/diagnosis.js';
import type { Colour, TextStyle } from './styled-text.js';

const SERIES_COLOURS: readonly Colour[] = ['cyan', 'yellow', 'magenta', 'green', 'blue', 'white'];
const SERIES_MARKERS: readonly string[] = ['o', '+', 'x', '*', '#', '%', '@', '='];

export interface SeriesStyle {
  readonly colour: Colour;
  readonly marker: string;
}

/** Style number `index` (colours and markers cycle independently, so 48 series stay distinct). */
export function seriesStyle(index: number): SeriesStyle {
  const i = Math.max(0, Math.floor(index));
  return { colour: SERIES_COLOURS[i % SERIES_COLOURS.length], marker: SERIES_MARKERS[i % SERIES_MARKERS.length] };
}

const STATE_STYLES: Readonly<Record<State, TextStyle>> = {
  converged: { fg: 'green', bold: true },
  converging: { fg: 'cyan' },
  undecided: { fg: 'white' },
  stalled: { fg: 'yellow', bold: true },
  oscillating: { fg: 'magenta', bold: true },
  diverging: { fg: 'red', bold: true, underline: true },
  failed: { fg: 'red', bold: true, inverse: true },
};

export function stateStyle(state: State | null): TextStyle {
  return state === null ? {} : STATE_STYLES[state];
}

/** The verdict banner: the whole row in the state's colour (reverse video), so it reads from afar. */
export function bannerStyle(state: State | null): TextStyle {
  if (state === null) return { inverse: true };
  const colour = STATE_STYLES[state].fg;
  return { fg: 'black', bg: colour, bold: true, inverse: colour === undefined };
}
