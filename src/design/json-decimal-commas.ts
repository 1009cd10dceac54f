/**
 * Decimal commas typed into a list of numbers: `[412,5, 398,1, 455,7]` is valid JSON, but it holds
 * six numbers (412, 5, 398, 1, 455, 7), not three, and a check on them gives a verdict from misread
 * data. A list whose numbers are separated by "," in some places and by ", " (or a line end) in
 * others is taken as that mistake and refused; a list written one way throughout is read as written.
 */

export interface MixedList {
  /** Where the list starts in the text (its "["). */
  position: number;
  line: number;
  /** The list as written, cut to a readable length. */
  text: string;
}

/** The innermost lists of numbers (no brackets inside). */
const LIST = /\[([-+0-9.eE,\s]*)\]/g;

/**
 * The first list of numbers with both kinds of separator, or null.
 * @example mixedListSeparators('{"s": [412,5, 398,1]}') // { position: 6, line: 1, text: "[412,5, 398,1]" }
 */
export function mixedListSeparators(text: string): MixedList | null {
  for (const m of text.matchAll(LIST)) {
    const body = m[1];
    if (!/\d,\d/.test(body) || !/\d,\s+[-\d.]/.test(body)) continue;
    const list = m[0].replace(/\s+/g, " ");
    return { position: m.index, line: text.slice(0, m.index).split("\n").length, text: list.length > 60 ? `${list.slice(0, 57)}...` : list };
  }
  return null;
}
