/**
 * Turn a captured terminal screen (text with SGR colour sequences, as `tmux capture-pane -e -p`
 * prints it) into an SVG picture. Pure. Our own small converter: cells on a fixed grid, one
 * background rectangle per run of equal background, one text element per run of equal style, each
 * stretched to its exact column width so the grid holds whatever monospace font the viewer has.
 *
 * SGR parameters follow ECMA-48 §8.3.117 (Select Graphic Rendition) with the xterm 256-colour and
 * direct-colour extensions (38;5;n, 38;2;r;g;b). Cost O(rows × cols).
 */

export interface Cell {
  readonly char: string;
  readonly fg?: string;
  readonly bg?: string;
  readonly bold: boolean;
  readonly underline: boolean;
}

interface Pen {
  fg?: string;
  bg?: string;
  bold: boolean;
  underline: boolean;
  inverse: boolean;
}

/** Colours 0–15: our own palette for a dark background. */
const BASIC = [
  '#1b1d23', '#e0605e', '#7cc26b', '#e3c063', '#5f9de0', '#c97fd6', '#5cc6d0', '#c8cbd2',
  '#6b7080', '#ff8a85', '#a3e08f', '#ffd97a', '#8cbcff', '#e3a6ef', '#8ae6ee', '#ffffff',
];
export const DEFAULT_FG = '#d7dae0';
export const DEFAULT_BG = '#1b1d23';

/** Colour n of the xterm 256-colour table: 16 basic, a 6×6×6 cube (levels 0, 95, 135, 175, 215, 255), 24 greys (8 + 10 k). */
export function xtermColour(n: number): string {
  if (n < 16) return BASIC[n];
  const hex = (v: number): string => v.toString(16).padStart(2, '0');
  if (n < 232) {
    const levels = [0, 95, 135, 175, 215, 255];
    const i = n - 16;
    return `#${hex(levels[Math.floor(i / 36)])}${hex(levels[Math.floor(i / 6) % 6])}${hex(levels[i % 6])}`;
  }
  const grey = 8 + 10 * (n - 232);
  return `#${hex(grey)}${hex(grey)}${hex(grey)}`;
}

function applySgr(pen: Pen, params: number[]): void {
  if (params.length === 0) params = [0];
  for (let i = 0; i < params.length; i++) {
    const p = params[i];
    if (p === 0) Object.assign(pen, { fg: undefined, bg: undefined, bold: false, underline: false, inverse: false });
    else if (p === 1) pen.bold = true;
    else if (p === 4) pen.underline = true;
    else if (p === 7) pen.inverse = true;
    else if (p === 22) pen.bold = false;
    else if (p === 24) pen.underline = false;
    else if (p === 27) pen.inverse = false;
    else if (p >= 30 && p <= 37) pen.fg = BASIC[p - 30];
    else if (p === 39) pen.fg = undefined;
    else if (p >= 40 && p <= 47) pen.bg = BASIC[p - 40];
    else if (p === 49) pen.bg = undefined;
    else if (p >= 90 && p <= 97) pen.fg = BASIC[p - 90 + 8];
    else if (p >= 100 && p <= 107) pen.bg = BASIC[p - 100 + 8];
    else if ((p === 38 || p === 48) && params[i + 1] === 5 && params[i + 2] !== undefined) {
      const colour = xtermColour(params[i + 2]);
      if (p === 38) pen.fg = colour;
      else pen.bg = colour;
      i += 2;
    } else if ((p === 38 || p === 48) && params[i + 1] === 2 && params[i + 4] !== undefined) {
      const colour = `#${params.slice(i + 2, i + 5).map((v) => Math.max(0, Math.min(255, v)).toString(16).padStart(2, '0')).join('')}`;
      if (p === 38) pen.fg = colour;
      else pen.bg = colour;
      i += 4;
    }
  }
}

/** The screen as a grid of `rows` × `cols` cells. Other escape sequences are skipped. */
export function parseAnsiScreen(text: string, cols: number, rows: number): Cell[][] {
  const blank = (): Cell => ({ char: ' ', bold: false, underline: false });
  const grid: Cell[][] = Array.from({ length: rows }, () => Array.from({ length: cols }, blank));
  const pen: Pen = { bold: false, underline: false, inverse: false };
  const lines = text.replace(/\r/g, '').split('\n');
  for (let y = 0; y < Math.min(rows, lines.length); y++) {
    const line = lines[y];
    let x = 0;
    for (let i = 0; i < line.length;) {
      if (line[i] === '\x1b') {
        const match = CSI.exec(line.slice(i));
        if (match !== null) {
          if (match[2] === 'm') applySgr(pen, match[1] === '' ? [] : match[1].split(/[;:]/).map((v) => Number(v) || 0));
          i += match[0].length;
        } else {
          i += line.slice(i, i + 2) === '\x1b(' ? 3 : 2; // character-set selection or an unknown two-byte escape
        }
        continue;
      }
      const char = String.fromCodePoint(line.codePointAt(i) ?? 32);
      i += char.length;
      if (x >= cols) continue;
      const fg = pen.inverse ? (pen.bg ?? DEFAULT_BG) : pen.fg;
      const bg = pen.inverse ? (pen.fg ?? DEFAULT_FG) : pen.bg;
      grid[y][x] = { char, fg, bg, bold: pen.bold, underline: pen.underline };
      x++;
    }
  }
  return grid;
}

export interface SvgOptions {
  readonly fontSize?: number;
  readonly title?: string;
}

/** A control sequence introducer (ESC [) with its parameters and final letter. */
const CSI = new RegExp(`^${String.fromCharCode(27)}\\[([0-9;:]*)([A-Za-z])`);

const escapeXml = (text: string): string => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** An SVG picture of the grid. */
export function screenToSvg(grid: readonly (readonly Cell[])[], options: SvgOptions = {}): string {
  const fontSize = options.fontSize ?? 14;
  const cellWidth = fontSize * 0.6;
  const cellHeight = Math.round(fontSize * 1.25);
  const rows = grid.length;
  const cols = rows === 0 ? 0 : grid[0].length;
  const width = Math.ceil(cols * cellWidth) + 20;
  const height = rows * cellHeight + 20;
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img">`,
  ];
  if (options.title !== undefined) parts.push(`<title>${escapeXml(options.title)}</title>`);
  parts.push(`<rect width="100%" height="100%" rx="6" fill="${DEFAULT_BG}"/>`,
    `<g transform="translate(10 10)" font-family="'DejaVu Sans Mono', Menlo, Consolas, 'Liberation Mono', monospace" font-size="${fontSize}">`);
  grid.forEach((row, y) => {
    // Backgrounds.
    for (let x = 0; x < cols;) {
      const bg = row[x].bg;
      let end = x + 1;
      while (end < cols && row[end].bg === bg) end++;
      if (bg !== undefined) parts.push(`<rect x="${(x * cellWidth).toFixed(1)}" y="${y * cellHeight}" width="${((end - x) * cellWidth).toFixed(1)}" height="${cellHeight}" fill="${bg}"/>`);
      x = end;
    }
    // Text runs of one style; blank runs are left out.
    const baseline = y * cellHeight + Math.round(fontSize * 0.95);
    for (let x = 0; x < cols;) {
      const cell = row[x];
      let end = x + 1;
      while (end < cols && row[end].fg === cell.fg && row[end].bold === cell.bold && row[end].underline === cell.underline) end++;
      const text = row.slice(x, end).map((c) => c.char).join('');
      if (text.trim() !== '') {
        const attributes = [
          `x="${(x * cellWidth).toFixed(1)}"`,
          `y="${baseline}"`,
          `textLength="${((end - x) * cellWidth).toFixed(1)}"`,
          'lengthAdjust="spacingAndGlyphs"',
          `fill="${cell.fg ?? DEFAULT_FG}"`,
        ];
        if (cell.bold) attributes.push('font-weight="bold"');
        if (cell.underline) attributes.push('text-decoration="underline"');
        parts.push(`<text ${attributes.join(' ')} xml:space="preserve">${escapeXml(text)}</text>`);
      }
      x = end;
    }
  });
  parts.push('</g>', '</svg>');
  return `${parts.join('\n')}\n`;
}

/** `parseAnsiScreen` then `screenToSvg`. */
export function ansiToSvg(text: string, cols: number, rows: number, options: SvgOptions = {}): string {
  return screenToSvg(parseAnsiScreen(text, cols, rows), options);
}
