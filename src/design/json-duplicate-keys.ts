/**
 * A key written twice in one object of a JSON text. `JSON.parse` keeps the
 * last value without a word (ECMA-262, JSON.parse, InternalizeJSONProperty
 * order), and RFC 8259 section 4 only says names SHOULD be unique; in a
 * hand-edited check file a second `"survival"` line added instead of the
 * first one changed silently decides the verdict. So a duplicate is found
 * and refused, with both lines.
 */

export interface DuplicateKey {
  /** Dotted path of the object holding the key ("requirement"; "" for the top level). */
  path: string;
  key: string;
  firstLine: number;
  line: number;
}

interface Frame {
  /** Keys seen with their lines; null for an array. */
  keys: Map<string, number> | null;
  path: string;
  index: number;
  /** The key whose value comes next (objects). */
  key: string;
  expectKey: boolean;
}

/**
 * The first duplicate key of a text that is valid JSON (call after JSON.parse succeeded), or null.
 * @example firstDuplicateKey('{"a": 1,\n "a": 2}') // { path: "", key: "a", firstLine: 1, line: 2 }
 */
export function firstDuplicateKey(text: string): DuplicateKey | null {
  return walk(text, text.length).duplicate;
}

/**
 * The dotted path of the value that holds the character at `position` of a valid JSON text
 * ("material.strengths" for a number inside that list; "part.stresses[1]" inside a nested list).
 * @example pathAt('{"m": {"s": [1, 2]}}', 13) // "m.s"
 */
export function pathAt(text: string, position: number): string {
  const stack = walk(text, position).stack;
  const top = stack[stack.length - 1];
  return top ? top.path : "";
}

/** Scans valid JSON up to `end`, tracking the open objects and lists, and stops at a duplicate key. */
function walk(text: string, end: number): { duplicate: DuplicateKey | null; stack: Frame[] } {
  const stack: Frame[] = [];
  let line = 1;
  const n = Math.min(end, text.length);
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === 10) line++;
    else if (c === 34) {
      // A string: find its end (a backslash escapes the next character).
      const start = i + 1;
      let j = start;
      while (j < text.length && text.charCodeAt(j) !== 34) j += text.charCodeAt(j) === 92 ? 2 : 1;
      const top = stack[stack.length - 1];
      if (top && top.keys && top.expectKey) {
        const key = JSON.parse(text.slice(start - 1, j + 1)) as string;
        const seen = top.keys.get(key);
        if (seen !== undefined) return { duplicate: { path: top.path, key, firstLine: seen, line }, stack };
        top.keys.set(key, line);
        top.key = key;
        top.expectKey = false;
      }
      i = j;
    } else if (c === 123 || c === 91) {
      const top = stack[stack.length - 1];
      const path = !top ? "" : top.keys ? join(top.path, top.key) : `${top.path}[${top.index}]`;
      stack.push({ keys: c === 123 ? new Map() : null, path, index: 0, key: "", expectKey: c === 123 });
    } else if (c === 125 || c === 93) stack.pop();
    else if (c === 44) {
      const top = stack[stack.length - 1];
      if (top.keys) top.expectKey = true;
      else top.index++;
    }
  }
  return { duplicate: null, stack };
}

function join(path: string, key: string): string {
  return path === "" ? key : `${path}.${key}`;
}
