/**
 * The Weibull probability plot as SVG, drawn with d3 scales, axes and line
 * generators: strength on a log axis in the form's stress unit, failure
 * probability on the Weibull axis ln(-ln(1 - P)) labelled in percent.
 * Colours and strokes come from taskpane.css classes, so the page's content
 * security policy needs no inline styles. Nothing here is text from the
 * user except the stress unit, which d3 sets as text content.
 */
import { axisBottom, axisLeft } from "d3-axis";
import { scaleLinear, scaleLog, type ScaleLogarithmic } from "d3-scale";
import { select } from "d3-selection";
import { area, line, symbol, symbolDiamond, symbolTriangle } from "d3-shape";
import { weibullY, type PlotData, type StressProbability, type BandPoint } from "./plot-data";

const SVG_NS = "http://www.w3.org/2000/svg";
const WIDTH = 440;
const HEIGHT = 360;
const MARGIN = { top: 14, right: 14, bottom: 46, left: 62 };

const PROBABILITY_TICKS = [
  1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4, 1e-3, 0.01, 0.05, 0.1, 0.2, 0.632, 0.9, 0.99,
];

/** "0.01 %", "63.2 %", "1e-5 %": probability in percent, as short as it stays exact. */
export function percentLabel(p: number): string {
  const v = p * 100;
  if (v < 0.001) return `${v.toExponential(0)} %`;
  return `${Number(v.toPrecision(3))} %`;
}

let plotCount = 0;

export function drawProbabilityPlot(container: HTMLElement, data: PlotData, stressUnit: string): SVGSVGElement {
  const id = `plot-${++plotCount}`;
  const x = scaleLog().domain(data.stressRange).range([MARGIN.left, WIDTH - MARGIN.right]);
  const y = scaleLinear()
    .domain([weibullY(data.probabilityRange[0]), weibullY(data.probabilityRange[1])])
    .range([HEIGHT - MARGIN.bottom, MARGIN.top]);
  const px = (s: StressProbability) => x(s.stress);
  const py = (s: StressProbability) => y(weibullY(s.probability));

  const svgNode = document.createElementNS(SVG_NS, "svg");
  const svg = select(svgNode)
    .attr("viewBox", `0 0 ${WIDTH} ${HEIGHT}`)
    .attr("class", "probability-plot")
    .attr("role", "img")
    .attr("aria-labelledby", `${id}-title ${id}-desc`);
  svg.append("title").attr("id", `${id}-title`).text("Weibull probability plot");
  svg.append("desc").attr("id", `${id}-desc`).text(describe(data, stressUnit));

  svg.append("clipPath").attr("id", `${id}-clip`)
    .append("rect")
    .attr("x", MARGIN.left).attr("y", MARGIN.top)
    .attr("width", WIDTH - MARGIN.left - MARGIN.right).attr("height", HEIGHT - MARGIN.top - MARGIN.bottom);

  const probabilityTicks = PROBABILITY_TICKS.filter(
    (p) => p >= data.probabilityRange[0] && p <= data.probabilityRange[1],
  ).map(weibullY);

  // Grid lines under everything.
  const grid = svg.append("g").attr("class", "grid").attr("aria-hidden", "true");
  grid.append("g").attr("transform", `translate(0,${HEIGHT - MARGIN.bottom})`)
    .call(axisBottom(x).tickValues(stressTicks(x)).tickSize(-(HEIGHT - MARGIN.top - MARGIN.bottom)).tickFormat(() => ""));
  grid.append("g").attr("transform", `translate(${MARGIN.left},0)`)
    .call(axisLeft(y).tickValues(probabilityTicks).tickSize(-(WIDTH - MARGIN.left - MARGIN.right)).tickFormat(() => ""));

  const plot = svg.append("g").attr("clip-path", `url(#${id}-clip)`);

  if (data.band) {
    const bandArea = area<BandPoint>()
      .y((b) => y(weibullY(b.probability)))
      .x0((b) => x(b.lower))
      .x1((b) => x(b.upper));
    plot.append("path").attr("class", "band").attr("d", bandArea(data.band) ?? "");
  }
  const path = line<StressProbability>().x(px).y(py);
  if (data.partLine) plot.append("path").attr("class", "part-line").attr("d", path(data.partLine) ?? "");
  plot.append("path").attr("class", "fit-line").attr("d", path(data.specimenLine) ?? "");

  // Applied stress and the design point's guides.
  plot.append("line").attr("class", "applied")
    .attr("x1", x(data.applied)).attr("x2", x(data.applied))
    .attr("y1", MARGIN.top).attr("y2", HEIGHT - MARGIN.bottom);
  plot.append("path").attr("class", "design-guide")
    .attr("d", `M${MARGIN.left},${py(data.design)}H${px(data.design)}V${HEIGHT - MARGIN.bottom}`);

  plot.append("g").attr("class", "failures")
    .selectAll("circle").data(data.failures).join("circle")
    .attr("cx", px).attr("cy", py).attr("r", 3.6);

  // Censored specimens have no plotting position: mark their strengths along the bottom.
  plot.append("g").attr("class", "censored")
    .selectAll("path").data(data.censored).join("path")
    .attr("d", symbol(symbolTriangle, 60)())
    .attr("transform", (s) => `translate(${x(s)},${HEIGHT - MARGIN.bottom - 7})`);

  if (data.designLower) {
    svg.append("path").attr("class", "design-point-lower")
      .attr("d", symbol(symbolDiamond, 110)())
      .attr("transform", `translate(${px(data.designLower)},${py(data.designLower)})`);
  }
  svg.append("path").attr("class", "design-point")
    .attr("d", symbol(symbolDiamond, 110)())
    .attr("transform", `translate(${px(data.design)},${py(data.design)})`);

  svg.append("g").attr("class", "axis").attr("transform", `translate(0,${HEIGHT - MARGIN.bottom})`)
    .call(axisBottom(x).tickValues(stressTicks(x)).tickFormat((v) => String(Number(Number(v).toPrecision(3)))));
  svg.append("g").attr("class", "axis").attr("transform", `translate(${MARGIN.left},0)`)
    .call(axisLeft(y).tickValues(probabilityTicks).tickFormat((v) => percentLabel(-Math.expm1(-Math.exp(Number(v))))));

  svg.append("text").attr("class", "axis-title")
    .attr("x", (MARGIN.left + WIDTH - MARGIN.right) / 2).attr("y", HEIGHT - 8).attr("text-anchor", "middle")
    .text(`Stress (${stressUnit}, log scale)`);
  svg.append("text").attr("class", "axis-title")
    .attr("transform", `translate(14,${(MARGIN.top + HEIGHT - MARGIN.bottom) / 2}) rotate(-90)`)
    .attr("text-anchor", "middle")
    .text("Failure probability (Weibull scale)");

  container.replaceChildren(svgNode);
  return svgNode;
}

/**
 * Round stresses for a log axis: 1, 1.5, 2, 3, 4, 5, 6, 8 times a power of
 * ten, dropping any that would sit closer than MIN_GAP pixels to the last one
 * kept, so a narrow range still gets several labels and a wide one no clutter.
 */
const MANTISSAS = [1, 1.5, 2, 3, 4, 5, 6, 8];
const MIN_GAP = 34;

function stressTicks(x: ScaleLogarithmic<number, number>): number[] {
  const [lo, hi] = x.domain();
  const ticks: number[] = [];
  for (let e = Math.floor(Math.log10(lo)); e <= Math.ceil(Math.log10(hi)); e++) {
    for (const m of MANTISSAS) {
      const v = Number((m * 10 ** e).toPrecision(3));
      if (v < lo || v > hi) continue;
      if (ticks.length === 0 || x(v) - x(ticks[ticks.length - 1]) >= MIN_GAP) ticks.push(v);
    }
  }
  return ticks;
}

function describe(data: PlotData, unit: string): string {
  const parts = [
    `${data.failures.length} failures plotted against stress in ${unit}`,
    data.censored.length ? `${data.censored.length} censored specimens marked along the stress axis` : "",
    "the fitted line at specimen size",
    data.partLine ? "the same line moved to the part's size" : "",
    data.band ? "a confidence band" : "",
    `the design point at ${Number(data.design.stress.toPrecision(4))} ${unit} and failure probability ${percentLabel(data.design.probability)}`,
    data.designLower ? `the lower-bound allowable stress ${Number(data.designLower.stress.toPrecision(4))} ${unit}` : "",
    `and the applied stress ${Number(data.applied.toPrecision(4))} ${unit}`,
  ];
  return parts.filter(Boolean).join(", ") + ".";
}
