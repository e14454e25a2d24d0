import { describe, expect, it } from 'vitest';
import { escapeTags, fitLine, lineWidth, plainText, toBlessedTags } from '../../src/ui/styled-text.js';

describe('styled text', () => {
  it('fits a line to an exact width, cutting with an ellipsis or padding with spaces', () => {
    const line = [{ text: 'res_p ', style: { fg: 'cyan' as const } }, { text: 'converging' }];
    expect(plainText(fitLine(line, 10))).toBe('res_p con…');
    expect(plainText(fitLine(line, 20))).toBe('res_p converging    ');
    expect(lineWidth(fitLine(line, 3))).toBe(3);
  });

  it('escapes blessed tag braces in names', () => {
    expect(escapeTags('case{1}/run.log')).toBe('case{open}1{close}/run.log');
    expect(toBlessedTags([{ text: 'a{b}' }], true)).toBe('a{open}b{close}');
  });

  it('writes colour tags with colour, and only bold, underline and inverse without (a background becomes inverse)', () => {
    const line = [{ text: 'DIVERGING', style: { fg: 'black' as const, bg: 'red' as const, bold: true } }, { text: ' x', style: { fg: 'red' as const } }];
    expect(toBlessedTags(line, true)).toBe('{black-fg}{red-bg}{bold}DIVERGING{/bold}{/red-bg}{/black-fg}{red-fg} x{/red-fg}');
    expect(toBlessedTags(line, false)).toBe('{bold}{inverse}DIVERGING{/inverse}{/bold} x');
  });
});
