/**
 * help.html, generated from functions.json at build time and served with the
 * add-in: the host's formula tooltip links each function to its section here
 * (helpUrl <base>help.html#<id>), and the task pane links to the page. One
 * source (the adapters' JSDoc) feeds the tooltip, this page and the engine.
 */
import type { FunctionMetadata } from "../functions/metadata";
import { IN_THE_BACKGROUND } from "../functions/simulating";

export interface HelpFamily {
  title: string;
  ids: string[];
}

const escape = (text: string): string =>
  text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

/** The description without its example, and the example ("=BRITTLE...." to the end), if there is one. */
export function splitExample(description: string): { text: string; example: string | null } {
  const at = description.search(/Example: ?=BRITTLE\./);
  if (at < 0) return { text: description, example: null };
  return { text: description.slice(0, at).trim(), example: description.slice(at).replace(/^Example: ?/, "").trim() };
}

export function signature(f: FunctionMetadata): string {
  return `BRITTLE.${f.id}(${f.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ")})`;
}

function section(f: FunctionMetadata, returns: string | undefined): string {
  const { text, example } = splitExample(f.description);
  const rows = f.parameters
    .map((p) => {
      const kind = p.dimensionality === "matrix" ? "range" : p.type;
      return `<tr><td><code>${escape(p.name)}</code>${p.optional ? " (optional)" : ""}</td><td>${kind}</td><td>${escape(p.description ?? "")}</td></tr>`;
    })
    .join("\n");
  const shape = f.result.dimensionality === "matrix" ? " (spills into the neighbouring cells)" : "";
  return [
    `<section class="function" id="${escape(f.id)}">`,
    `<h3><code>${escape(signature(f))}</code></h3>`,
    `<p>${escape(text)}</p>`,
    f.parameters.length ? `<table><thead><tr><th>parameter</th><th>kind</th><th>meaning and unit</th></tr></thead><tbody>\n${rows}\n</tbody></table>` : "<p>No parameters.</p>",
    `<p><b>Returns:</b> ${escape(returns ?? f.result.type ?? "a value")}${shape}</p>`,
    example ? `<p><b>Example:</b> <code>${escape(example)}</code></p>` : "",
    f.options?.cancelable ? `<p>${escape(IN_THE_BACKGROUND)}</p>` : "",
    `</section>`,
  ]
    .filter(Boolean)
    .join("\n");
}

export function renderHelpPage(functions: FunctionMetadata[], families: HelpFamily[], returns: Record<string, string>): string {
  const listed = new Set(families.flatMap((family) => family.ids));
  const missing = functions.filter((f) => !listed.has(f.id)).map((f) => f.id);
  if (missing.length) throw new Error(`help page: functions in no family: ${missing.join(", ")}`);
  const byId = new Map(functions.map((f) => [f.id, f]));
  const contents = families
    .map((family) => `<li>${escape(family.title)}: ${family.ids.map((id) => `<a href="#${escape(id)}">${escape(id)}</a>`).join(", ")}</li>`)
    .join("\n");
  const body = families
    .map((family) => [`<h2>${escape(family.title)}</h2>`, ...family.ids.filter((id) => byId.has(id)).map((id) => section(byId.get(id)!, returns[id]))].join("\n"))
    .join("\n");
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'self'; img-src 'self'">
<title>Brittle design: function help</title>
<link rel="stylesheet" href="./help.css">
</head>
<body>
<header class="banner"><h1>Brittle design: function help</h1></header>
<main>
<p>Type <code>=BRITTLE.</code> in a cell to list the functions; each function's section below gives its
parameters with their units, what it returns and a worked example. Sizes are effective volumes or areas in any one
consistent unit, stresses in any one consistent stress unit.</p>
<p>Blank cells and zeros in a range of strengths are no specimen; text gives #VALUE! naming the cell; a negative or
out-of-range number, too few specimens or ranges of different shapes give #VALUE! with a message; a result that does
not apply gives #N/A with a message; #NUM! means a result beyond double precision (or a solve that did not
converge).</p>
<h2>The design-check form</h2>
<p>Open <b>Design check</b> on the Home tab. Work through the four steps: material data (paste strengths, use the
selected range, or type a modulus and characteristic strength), the test specimen (typed effective size, a standard
configuration, or bar dimensions), the part (typed effective size or an element table of stresses and sizes) and the
requirement (survival per part or failures per lot, the applied peak stress, and optionally a lifetime and a proof
test). The result lists each number with the method and assumptions behind it, the cautions that apply, and a
Weibull probability plot.</p>
<p><b>Write to a new worksheet</b> adds a sheet with a fresh name (it never writes over an existing sheet or cell): the
inputs, live BRITTLE formulas that recompute when the data change, a scatter chart of the plot points and the
cautions. Opened in a plain browser, the same page works without a spreadsheet and exports the check as CSV or as a
printable page.</p>
<p>The results support, and do not replace, the judgement of a licensed engineer under the codes that govern the
application.</p>
<nav><h2>Functions</h2><ul>
${contents}
</ul></nav>
${body}
</main>
</body>
</html>
`;
}
