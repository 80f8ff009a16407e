/**
 * Plain-text helpers shared by the description composer and the chapter parser. Everything here
 * is locale-free so web and api produce the same bytes from the same input.
 */

// C0 controls except tab and newline, and DEL: invisible, and they break the platform's text box.
const CONTROL_CHARS = /[\u0000-\u0008\u000B-\u001F\u007F]/g;

/** One-line text: NFC, controls removed, every run of whitespace (newlines too) made one space. */
export function inlineText(value: string): string {
  return value.normalize('NFC').replace(/\r\n?/g, '\n').replace(CONTROL_CHARS, '').replace(/\s+/g, ' ').trim();
}

/** Multi-line text: NFC, "\n" line ends, no trailing spaces, no leading/trailing or doubled blank lines. */
export function blockText(value: string): string {
  const lines = value
    .normalize('NFC')
    .replace(/\r\n?/g, '\n')
    .replace(CONTROL_CHARS, '')
    .split('\n')
    .map((line) => line.trimEnd());
  const kept: string[] = [];
  for (const line of lines) {
    if (line === '' && (kept.length === 0 || kept[kept.length - 1] === '')) continue;
    kept.push(line);
  }
  while (kept.length > 0 && kept[kept.length - 1] === '') kept.pop();
  return kept.join('\n');
}

/** Code-unit order: identical in every engine, unlike localeCompare. */
export function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Length as a person counts it: Unicode code points, so an emoji counts once, not twice. */
export function descriptionLength(text: string): number {
  let count = 0;
  for (const _ of text) count++;
  return count;
}

/** Text in typographic double quotes: “ISO sweep”. */
export const quote = (s: string) => `“${s}”`;

/** "1 chapter", "3 chapters". */
export const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** First letter upper-case: "chapter 2 …" → "Chapter 2 …". */
export function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
