/**
 * Styled text: lines as runs of characters with one style each. Painters produce these; the screen
 * shell turns them into blessed tags (with or without colour); tests read the plain text.
 */

export type Colour = 'black' | 'red' | 'green' | 'yellow' | 'blue' | 'magenta' | 'cyan' | 'white' | 'gray';

export interface TextStyle {
  readonly fg?: Colour;
  readonly bg?: Colour;
  readonly bold?: boolean;
  readonly underline?: boolean;
  readonly inverse?: boolean;
}

export interface Segment {
  readonly text: string;
  readonly style?: TextStyle;
}

export type StyledLine = readonly Segment[];

export function plainText(line: StyledLine): string {
  return line.map((segment) => segment.text).join('');
}

/** Characters in a line (code points; every glyph the dashboard uses is one cell wide). */
export function lineWidth(line: StyledLine): number {
  let width = 0;
  for (const segment of line) width += Array.from(segment.text).length;
  return width;
}

/** Cut a line to `width` cells and pad it with spaces to exactly `width`. */
export function fitLine(line: StyledLine, width: number): StyledLine {
  const out: Segment[] = [];
  let room = width;
  for (const segment of line) {
    if (room <= 0) break;
    const chars = Array.from(segment.text);
    if (chars.length <= room) {
      out.push(segment);
      room -= chars.length;
    } else {
      out.push({ text: `${chars.slice(0, Math.max(0, room - 1)).join('')}…`, style: segment.style });
      room = 0;
    }
  }
  if (room > 0) out.push({ text: ' '.repeat(room) });
  return out;
}

/** Escape blessed's tag braces in user text (file and series names). */
export function escapeTags(text: string): string {
  return text.replace(/[{}]/g, (brace) => (brace === '{' ? '{open}' : '{close}'));
}

/** blessed tag markup for a line. Without colour, only bold, underline and inverse are kept (a
 * background colour becomes inverse). */
export function toBlessedTags(line: StyledLine, colour: boolean): string {
  let out = '';
  for (const segment of line) {
    const style = segment.style;
    const text = escapeTags(segment.text);
    if (style === undefined) {
      out += text;
      continue;
    }
    const open: string[] = [];
    if (colour && style.fg !== undefined) open.push(`${style.fg}-fg`);
    if (colour && style.bg !== undefined) open.push(`${style.bg}-bg`);
    if (style.bold) open.push('bold');
    if (style.underline) open.push('underline');
    // A background colour is how a banner stands out; without colour, reverse video does that job.
    if (style.inverse || (!colour && style.bg !== undefined)) open.push('inverse');
    if (open.length === 0) {
      out += text;
      continue;
    }
    out += open.map((tag) => `{${tag}}`).join('') + text + open.slice().reverse().map((tag) => `{/${tag}}`).join('');
  }
  return out;
}
