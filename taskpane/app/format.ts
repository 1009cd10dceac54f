/** How numbers read on screen and in exports: four significant figures, probabilities also as "1 in N". */
export function sig(x: number, digits = 4): string {
  if (x === 0) return "0";
  const abs = Math.abs(x);
  if (abs >= 1e-3 && abs < 1e7) return Number(x.toPrecision(digits)).toLocaleString("en-US", { maximumSignificantDigits: digits });
  return x.toExponential(digits - 1);
}

export function formatProbability(p: number): string {
  if (p === 0) return "0";
  const main = p >= 1e-3 ? `${Number((p * 100).toPrecision(3))} %` : p.toExponential(2);
  if (p >= 0.5) return main;
  const oneIn = 1 / p;
  const n = oneIn < 1e12 ? Math.round(oneIn).toLocaleString("en-US") : oneIn.toExponential(1);
  return `${main} (1 in ${n})`;
}

export function formatPercent(p: number): string {
  return `${Number((p * 100).toPrecision(4))} %`;
}
