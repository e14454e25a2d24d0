/**
 * A small well-formedness check for the XML that settle writes (SVG): every tag closed in order,
 * attributes quoted and unique, only the five predefined entities or numeric references, one root.
 * Not a full XML parser (no DTDs, CDATA or processing instructions, which settle never writes);
 * returns the problems found, empty when none.
 */
export function xmlProblems(text: string): string[] {
  const problems: string[] = [];
  const stack: string[] = [];
  let roots = 0;
  const token = /<(\/?)([A-Za-z][\w:.-]*)((?:\s+[\w:.-]+\s*=\s*(?:"[^"<]*"|'[^'<]*'))*)\s*(\/?)>|<!--[\s\S]*?-->|(<)|(&(?!(?:amp|lt|gt|quot|apos|#\d+|#x[0-9a-fA-F]+);))/g;
  let match: RegExpExecArray | null;
  while ((match = token.exec(text)) !== null) {
    const [whole, closing, name, attributes, selfClosing, strayLt, badAmp] = match;
    if (strayLt) { problems.push(`stray '<' or malformed tag at ${match.index}: ${text.slice(match.index, match.index + 40)}`); continue; }
    if (badAmp) { problems.push(`bare '&' at ${match.index}`); continue; }
    if (whole.startsWith('<!--')) continue;
    if (closing) {
      const open = stack.pop();
      if (open !== name) problems.push(`</${name}> closes <${open ?? 'nothing'}> at ${match.index}`);
      continue;
    }
    const seen = new Set<string>();
    for (const a of attributes.matchAll(/([\w:.-]+)\s*=/g)) {
      if (seen.has(a[1])) problems.push(`<${name}> repeats attribute ${a[1]}`);
      seen.add(a[1]);
    }
    if (stack.length === 0) roots++;
    if (!selfClosing) stack.push(name);
  }
  if (stack.length > 0) problems.push(`unclosed: ${stack.join(' > ')}`);
  if (roots !== 1) problems.push(`expected one root element, found ${roots}`);
  return problems;
}
