/**
 * Invented demo data: 24 four-point bend bars of a fictional 96 % alumina
 * ("demo lot A"), strengths in MPa, two of them flagged as breaking from
 * machining damage (censored). No real material or test lies behind these
 * numbers; they exist to show the form working.
 */
export const DEMO_TEXT = [
  "strength_MPa\tcensored",
  "286.4", "301.9", "312.2", "318.7\tc", "324.0", "329.5", "333.1", "338.6",
  "342.2", "345.9", "349.0", "352.7", "356.8", "360.1", "363.9", "367.4\tc",
  "371.5", "376.0", "380.2", "385.7", "391.3", "398.8", "406.5", "418.0",
].join("\n");

export const DEMO_DESCRIPTION =
  "Invented demo: 24 bend bars of a fictional alumina (demo lot A), two censored at machining damage.";

/** Sizes and requirement that go with the demo (also invented). */
export const DEMO_DESIGN = {
  specimenSize: "9.8",
  partSize: "420",
  appliedStress: "150",
  survival: "0.9999",
  lotSize: "10000",
};
