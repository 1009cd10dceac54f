// The hostile corpus for MATERIALFIT's configuration cells (test/fixtures/hostile/material-configurations.json):
// each case says which failure it guards against; the reading or the refusal must be exactly the expected one.
import { describe, expect, it } from "vitest";
import { parseConfiguration, sizeLaw } from "../src/design/specimen-geometry";
import { InputError } from "../src/errors";
import { fixture } from "./helpers";

const corpus = fixture("hostile/material-configurations.json");

describe("hostile configuration cells", () => {
  for (const c of corpus.cases) {
    it(`guards against ${c.guards}: ${JSON.stringify(c.text)}`, () => {
      if (c.geometry) {
        expect(parseConfiguration(c.text)).toEqual(c.geometry);
        // Readable geometries also give a finite size law (surface flaws need no thickness).
        const law = sizeLaw({ geometry: parseConfiguration(c.text), flaws: "surface", poisson: 0.25 });
        expect(Number.isFinite(law.logSize(10))).toBe(true);
        return;
      }
      let error: unknown;
      try {
        // Parsing may accept a number that the size law then refuses: either refusal is an InputError.
        sizeLaw({ geometry: parseConfiguration(c.text), flaws: "volume", poisson: 0.25 });
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(InputError);
      if (c.error) expect((error as Error).message).toContain(c.error);
    });
  }
});
