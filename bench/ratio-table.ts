/**
 * Prints the README ratio table of a recorded run again, without measuring anything:
 *
 *     node bin/run-ts.js bench/ratio-table.ts [bench/results/bench-....json]
 *
 * Without a file, the newest record in bench/results/.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { markdownTable, type BenchRecord } from "./report";

const results = join("bench", "results");
const file =
  process.argv[2] ??
  readdirSync(results)
    .filter((name) => /^bench-.*\.json$/.test(name))
    .sort()
    .map((name) => join(results, name))
    .pop();
if (!file) throw new Error(`no record in ${results}: run npm run bench first`);
const record = JSON.parse(readFileSync(file, "utf8")) as BenchRecord;
if (!Array.isArray(record.paired)) throw new Error(`${file} is not a record of this benchmark (no paired rows)`);
process.stdout.write(markdownTable(record));
