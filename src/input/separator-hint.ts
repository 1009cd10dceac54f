/**
 * The delimiter line some programs write at the top of a CSV so that a
 * spreadsheet splits it right in any locale: `sep=;`, `sep=,`, or `sep=`
 * followed by a tab. A spreadsheet that honours it takes the delimiter from
 * it and does not show the line as a row, so the header is row 1 and
 * `A2:A11` means the ten lines after it. Read the same way here; before,
 * the line became row 1 and every reference pointed one line too high.
 * (The convention is common practice, no formal source.)
 */

export interface SeparatorHint {
  /** The delimiter character named. */
  delimiter: string;
  /** The line as written, for the report ("sep=;"). */
  text: string;
}

const HINT = /^sep=([^\r\n])[ \t]*(?:\r\n|\n|\r|$)/i;

/**
 * The hint on the first line of a text (byte-order mark already removed), or null.
 * @example separatorHint("sep=;\nid;s\n") // { delimiter: ";", text: "sep=;" }
 */
export function separatorHint(text: string): SeparatorHint | null {
  const m = HINT.exec(text.slice(0, 16));
  return m ? { delimiter: m[1], text: `sep=${m[1] === "\t" ? "<tab>" : m[1]}` } : null;
}
