import { describe, expect, it } from 'vitest';
import { ansiToSvg, DEFAULT_FG, parseAnsiScreen, xtermColour } from '../../src/ui/ansi-to-svg.js';

const ESC = String.fromCharCode(27);
const sgr = (params: string): string => `${ESC}[${params}m`;

describe('parseAnsiScreen (SGR per ECMA-48 §8.3.117)', () => {
  it('places characters on the grid and pads the rest with blanks', () => {
    const grid = parseAnsiScreen('ab\ncd', 3, 3);
    expect(grid.map((row) => row.map((cell) => cell.char).join(''))).toEqual(['ab ', 'cd ', '   ']);
  });

  it('applies colours, bold and underline, and resets them', () => {
    const grid = parseAnsiScreen(`${sgr('1;31')}R${sgr('0')}n${sgr('4;32')}G${sgr('24;39')}x`, 4, 1);
    expect(grid[0][0]).toMatchObject({ char: 'R', bold: true, fg: xtermColour(1) });
    expect(grid[0][1]).toMatchObject({ char: 'n', bold: false, fg: undefined });
    expect(grid[0][2]).toMatchObject({ char: 'G', underline: true, fg: xtermColour(2) });
    expect(grid[0][3]).toMatchObject({ char: 'x', underline: false, fg: undefined });
  });

  it('swaps colours for inverse video, using the defaults where none was set', () => {
    const grid = parseAnsiScreen(`${sgr('7')}a${sgr('27;44')}b`, 2, 1);
    expect(grid[0][0].bg).toBe(DEFAULT_FG);
    expect(grid[0][1].bg).toBe(xtermColour(4));
  });

  it('reads 256-colour and direct-colour parameters', () => {
    const grid = parseAnsiScreen(`${sgr('38;5;196')}a${sgr('48;2;1;2;255')}b`, 2, 1);
    expect(grid[0][0].fg).toBe('#ff0000'); // xterm cube index 196 = (5,0,0) → level 255, 0, 0
    expect(grid[0][1].bg).toBe('#0102ff');
  });

  it('skips other escape sequences and keeps multi-byte characters in one cell', () => {
    const grid = parseAnsiScreen(`${ESC}[2J${ESC}(B⠉─·x`, 4, 1);
    expect(grid[0].map((cell) => cell.char).join('')).toBe('⠉─·x');
  });
});

describe('xtermColour', () => {
  // xterm 256-colour table (xterm's 256colres.pl): cube levels 0, 95, 135, 175, 215, 255; greys 8 + 10 k.
  it.each([[16, '#000000'], [21, '#0000ff'], [46, '#00ff00'], [231, '#ffffff'], [232, '#080808'], [255, '#eeeeee']])('colour %i is %s', (n, hex) => {
    expect(xtermColour(n)).toBe(hex);
  });
});

describe('ansiToSvg', () => {
  it('writes a well-formed picture with escaped text, one background per run and stretched text runs', () => {
    const svg = ansiToSvg(`${sgr('41')}  ${sgr('0')}a<b&c`, 10, 2, { title: 'x & y' });
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg.trimEnd().endsWith('</svg>')).toBe(true);
    expect(svg).toContain('<title>x &amp; y</title>');
    expect(svg).toContain('a&lt;b&amp;c');
    expect(svg.match(/<rect x=/g)).toHaveLength(1);
    expect(svg).toContain(`fill="${xtermColour(1)}"`);
    expect(svg).toContain('lengthAdjust="spacingAndGlyphs"');
  });
});
