/**
 * The compiled command line's entry (lib/brittle.mjs, run by bin/brittle.js).
 */
import { main } from "./cli";

process.exitCode = await main(process.argv.slice(2));
