/**
 * Duplicate member names inside JSON text. JSON.parse keeps the last of two members with
 * the same name and says nothing, so `{"p": 2, "p": 0.3}` would land as 0.3 while another
 * reader (or the person who wrote the file) takes 2. Forelog refuses such text instead,
 * at every depth, naming the member and where its second appearance is.
 */
import { BACKSLASH, CLOSE_BRACE, CLOSE_BRACKET, COLON, COMMA, OPEN_BRACE, OPEN_BRACKET, QUOTE } from './json-codes';

/**
 * How many members the objects in a value built by JSON.parse hold, at every depth. Text
 * with as many members (one ":" outside strings each) has no name twice in any object.
 * Nesting is bounded before anything is parsed, so the recursion is too.
 */
export function memberCount(value: unknown): number {
  if (typeof value !== 'object' || value === null) return 0;
  let n = 0;
  if (Array.isArray(value)) {
    for (const item of value) if (typeof item === 'object' && item !== null) n += memberCount(item);
    return n;
  }
  for (const key in value) {
    n++;
    const item = (value as Record<string, unknown>)[key];
    if (typeof item === 'object' && item !== null) n += memberCount(item);
  }
  return n;
}

/**
 * The first member of `text` (valid JSON) whose name its object already holds, with the
 * offset of that second name's opening quote; null when no object repeats a name. Names
 * compare as JSON.parse reads them, so "p" and "\u0070" are the same name.
 */
export function duplicateMember(text: string): { key: string; offset: number } | null {
  // Per open container: the names seen so far (null for a list).
  const open: (Set<string> | null)[] = [];
  let expectName = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === QUOTE) {
      const start = i;
      for (i++; i < text.length; i++) {
        const s = text.charCodeAt(i);
        if (s === BACKSLASH) i++;
        else if (s === QUOTE) break;
      }
      const names = open[open.length - 1];
      if (expectName && names) {
        const raw = text.slice(start, i + 1);
        const key = raw.includes('\\') ? (JSON.parse(raw) as string) : raw.slice(1, -1);
        if (names.has(key)) return { key, offset: start };
        names.add(key);
        expectName = false;
      }
    } else if (c === OPEN_BRACE) {
      open.push(new Set());
      expectName = true;
    } else if (c === OPEN_BRACKET) {
      open.push(null);
      expectName = false;
    } else if (c === CLOSE_BRACE || c === CLOSE_BRACKET) {
      open.pop();
      expectName = false;
    } else if (c === COMMA) {
      expectName = open.length > 0 && open[open.length - 1] !== null;
    } else if (c === COLON) {
      expectName = false;
    }
  }
  return null;
}
