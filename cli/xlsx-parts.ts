/**
 * The parts of an .xlsx package that the workbook reader (exceljs 4.4) cannot
 * take, removed before it sees them. Its reader stops on charts ("reading
 * anchors") and on some comment and drawing layouts, so a workbook the task
 * pane's report writer made (a native chart) could not be evaluated at all.
 * Cell data, formulas, styles, merged cells and defined names live in other
 * parts and are untouched; what is removed is counted, so the command can say
 * what a written copy no longer holds.
 */
import JSZip from "jszip";
import { WorkbookError } from "./workbook-errors";
import { dateSystemEpoch, isoDateCellsToSerials } from "./xlsx-iso-dates";

/** What was taken out, by kind, for the message "not carried over: ...". */
export type DroppedParts = Record<DroppedKind, number>;
export type DroppedKind = "charts" | "images" | "comments" | "links to other workbooks" | "embedded objects";

/**
 * Limits on what is unpacked before the reader runs: a few kilobytes of zip
 * can hold gigabytes of XML. A sheet of two million filled cells is about
 * 100 MB of XML, so these leave room for every workbook the cell limit admits.
 */
export const MAX_PART_BYTES = 256 * 1024 * 1024;
export const MAX_PACKAGE_BYTES = 512 * 1024 * 1024;

const PART_KINDS: [RegExp, DroppedKind][] = [
  [/^xl\/charts\/chart[^/]*\.xml$/i, "charts"],
  [/^xl\/chartsheets\/[^/]*\.xml$/i, "charts"],
  [/^xl\/media\/[^/]+$/i, "images"],
  [/^xl\/externalLinks\/[^/]*\.xml$/i, "links to other workbooks"],
  [/^xl\/(embeddings|activeX|ctrlProps)\/[^/]*$/i, "embedded objects"],
];

/** Comments are counted inside their parts (one part per sheet holds all of its comments). */
const COMMENT_PARTS = /^xl\/comments[^/]*\.xml$/i;

/** Everything else belonging to those parts: drawings that hold charts and images, their relationships, legacy VML shapes. */
const COMPANION_PARTS = /^xl\/(charts|chartsheets|drawings|media|threadedComments|persons|externalLinks|embeddings|activeX|ctrlProps)\//i;

/** Relationship types (the end of the Type URI) that point at a removed part. */
const DROPPED_RELATIONSHIPS = /\/(drawing|vmlDrawing|comments|threadedComment|person|externalLink|chartsheet|oleObject|package|control|ctrlProp|image)"/;

/** Elements of a sheet or the workbook that reference removed parts. */
const DROPPED_ELEMENTS = [
  /<(?:\w+:)?(drawing|legacyDrawing|legacyDrawingHF|picture)\b[^>]*\/>/g,
  /<(?:\w+:)?(oleObjects|controls)\b[^>]*>[\s\S]*?<\/(?:\w+:)?\1>/g,
  /<(?:\w+:)?externalReferences\b[^>]*>[\s\S]*?<\/(?:\w+:)?externalReferences>/g,
];

/** A defined name as the file holds it; the reader never sees these (see readablePackage). */
export interface DefinedName {
  name: string;
  /** Position of the sheet in the workbook's sheet list when the name belongs to one sheet. */
  localSheet?: number;
  /** The name's formula, without "=", entities decoded: "Data!$A$2:$A$31". */
  formula: string;
  /** The element exactly as written, to put back into a written copy. */
  xml: string;
}

export interface ReadablePackage {
  bytes: Uint8Array;
  dropped: DroppedParts;
  names: DefinedName[];
  /** The names of the workbook's sheets in order, chart sheets included, for localSheet. */
  sheetOrder: string[];
  /** Days from 1970-01-01 back to day 0 of the workbook's date system (dateSystemEpoch). */
  dateEpoch: number;
}

/** The longest sheet name the workbook reader takes (a spreadsheet's usual limit). */
const MAX_SHEET_NAME = 31;

/** Checks the package's declared sizes, then removes the parts the reader cannot take. */
export async function readablePackage(bytes: Uint8Array, path: string, limits = { part: MAX_PART_BYTES, total: MAX_PACKAGE_BYTES }): Promise<ReadablePackage> {
  let zip: JSZip;
  try {
    zip = await JSZip.loadAsync(bytes);
  } catch (error) {
    throw new WorkbookError(`cannot read ${path} as an .xlsx workbook: ${firstLine(error)}`);
  }
  checkSizes(zip, path, limits);
  const dropped: DroppedParts = { charts: 0, images: 0, comments: 0, "links to other workbooks": 0, "embedded objects": 0 };
  const removed = new Set<string>();
  for (const name of Object.keys(zip.files)) {
    if (zip.files[name].dir) continue;
    const kind = PART_KINDS.find(([pattern]) => pattern.test(name))?.[1];
    if (kind) dropped[kind]++;
    if (COMMENT_PARTS.test(name)) dropped.comments += (await zip.file(name)!.async("string")).match(/<(?:\w+:)?comment\b/g)?.length ?? 0;
    if (kind || COMMENT_PARTS.test(name) || COMPANION_PARTS.test(name)) removed.add(name);
  }
  // exceljs expands every defined name into one object per cell it covers, so a name over a full
  // column or a whole sheet (=Sheet1!$A:$XFD) takes minutes or aborts: names are read here instead.
  const workbookXml = (await zip.file("xl/workbook.xml")?.async("string")) ?? "";
  const names = definedNames(workbookXml);
  const sheetOrder = [...workbookXml.matchAll(/<(?:\w+:)?sheet\b[^>]*\bname="([^"]*)"/g)].map((m) => decodeXml(m[1]));
  // Some spreadsheet programs allow longer sheet names than the usual 31 characters; the workbook reader
  // cuts them and then stops on "Worksheet name already exists", which says nothing useful.
  const long = sheetOrder.find((s) => s.length > MAX_SHEET_NAME);
  if (long !== undefined) {
    throw new WorkbookError(`${path}: the sheet name "${long}" has ${long.length} characters; brittle reads sheet names of at most ${MAX_SHEET_NAME}, as most spreadsheets allow: rename the sheet`);
  }
  if (names.length > 0) {
    zip.file("xl/workbook.xml", workbookXml.replace(/<(?:\w+:)?definedNames\b[^>]*>[\s\S]*?<\/(?:\w+:)?definedNames>|<(?:\w+:)?definedNames\b[^>]*\/>/g, ""));
  }
  // Date cells written as ISO text (t="d") become serial numbers: the reader would read 2024-03-01 as 2024.
  const epoch = dateSystemEpoch(workbookXml);
  let datesRewritten = false;
  for (const name of Object.keys(zip.files)) {
    if (!/^xl\/worksheets\/[^/]*\.xml$/i.test(name)) continue;
    const xml = await zip.file(name)!.async("string");
    const serials = isoDateCellsToSerials(xml, epoch, `${path}: ${name}`);
    if (serials !== xml) {
      zip.file(name, serials);
      datesRewritten = true;
    }
  }
  if (removed.size === 0 && names.length === 0 && !datesRewritten) return { bytes, dropped, names, sheetOrder, dateEpoch: epoch };
  // A chart sheet is a sheet of the workbook: the sheet list must lose it too, or the reader looks for it.
  const chartSheetIds = await relationshipIds(zip, "xl/_rels/workbook.xml.rels", /\/chartsheet"/);
  for (const name of removed) zip.remove(name);
  for (const name of Object.keys(zip.files)) {
    if (/^xl\/(worksheets\/_rels\/[^/]*|_rels\/workbook\.xml)\.rels$/i.test(name)) {
      await rewrite(zip, name, (xml) => xml.replace(/<Relationship\b[^>]*\/>/g, (rel) => (DROPPED_RELATIONSHIPS.test(rel) ? "" : rel)));
    } else if (/^xl\/worksheets\/[^/]*\.xml$/i.test(name) || name === "xl/workbook.xml") {
      await rewrite(zip, name, (xml) => {
        let out = DROPPED_ELEMENTS.reduce((text, pattern) => text.replace(pattern, ""), xml);
        if (name === "xl/workbook.xml") {
          for (const id of chartSheetIds) out = out.replace(new RegExp(`<(?:\\w+:)?sheet\\b[^>]*r:id="${id}"[^>]*/>`, "g"), "");
        }
        return out;
      });
    } else if (name === "[Content_Types].xml") {
      await rewrite(zip, name, (xml) =>
        xml.replace(/<Override\b[^>]*PartName="\/([^"]+)"[^>]*\/>/g, (override, part: string) => (removed.has(part) ? "" : override)),
      );
    }
  }
  return { bytes: await zip.generateAsync({ type: "uint8array" }), dropped, names, sheetOrder, dateEpoch: epoch };
}

function definedNames(workbookXml: string): DefinedName[] {
  const block = /<(?:\w+:)?definedNames\b[^>]*>([\s\S]*?)<\/(?:\w+:)?definedNames>/.exec(workbookXml);
  if (!block) return [];
  return [...block[1].matchAll(/<(?:\w+:)?definedName\b([^>]*)>([\s\S]*?)<\/(?:\w+:)?definedName>/g)].map((m) => {
    const name = decodeXml(/\bname="([^"]*)"/.exec(m[1])?.[1] ?? "");
    const local = /\blocalSheetId="(\d+)"/.exec(m[1]);
    return { name, ...(local ? { localSheet: Number(local[1]) } : {}), formula: decodeXml(m[2]).trim(), xml: m[0] };
  });
}

export function decodeXml(text: string): string {
  return text.replace(/&(lt|gt|amp|quot|apos|#\d+|#x[0-9a-f]+);/gi, (_, e: string) => {
    const named: Record<string, string> = { lt: "<", gt: ">", amp: "&", quot: '"', apos: "'" };
    if (e[0] !== "#") return named[e.toLowerCase()];
    return String.fromCodePoint(e[1] === "x" || e[1] === "X" ? parseInt(e.slice(2), 16) : Number(e.slice(1)));
  });
}

/**
 * Puts defined names back into a workbook the writer produced (it wrote none,
 * since the reader never saw them): after the sheet list, where the file
 * format places them.
 */
export async function restoreDefinedNames(bytes: Uint8Array, names: DefinedName[]): Promise<Uint8Array> {
  if (names.length === 0) return bytes;
  const zip = await JSZip.loadAsync(bytes);
  const xml = await zip.file("xl/workbook.xml")!.async("string");
  const block = `<definedNames>${names.map((n) => n.xml.replace(/<(\/?)\w+:definedName\b/g, "<$1definedName")).join("")}</definedNames>`;
  const withoutOld = xml.replace(/<definedNames\b[^>]*>[\s\S]*?<\/definedNames>|<definedNames\b[^>]*\/>/g, "");
  zip.file("xl/workbook.xml", withoutOld.replace(/<\/sheets>/, `</sheets>${block}`));
  return zip.generateAsync({ type: "uint8array", compression: "DEFLATE" });
}

function checkSizes(zip: JSZip, path: string, limits: { part: number; total: number }): void {
  let total = 0;
  for (const [name, file] of Object.entries(zip.files)) {
    // The central directory's uncompressed size: known before anything is inflated.
    const size = (file as unknown as { _data?: { uncompressedSize?: number } })._data?.uncompressedSize ?? 0;
    if (size > limits.part) {
      throw new WorkbookError(`${path}: part ${name} unpacks to ${megabytes(size)} MB; brittle reads parts of at most ${megabytes(limits.part)} MB`);
    }
    total += size;
  }
  if (total > limits.total) {
    throw new WorkbookError(`${path} unpacks to ${megabytes(total)} MB; brittle reads workbooks of at most ${megabytes(limits.total)} MB unpacked`);
  }
}

async function relationshipIds(zip: JSZip, name: string, type: RegExp): Promise<string[]> {
  const file = zip.file(name);
  if (!file) return [];
  const xml = await file.async("string");
  return [...xml.matchAll(/<Relationship\b[^>]*\/>/g)].filter((m) => type.test(m[0])).map((m) => /\bId="([^"]+)"/.exec(m[0])?.[1] ?? "").filter(Boolean);
}

async function rewrite(zip: JSZip, name: string, change: (xml: string) => string): Promise<void> {
  const file = zip.file(name);
  if (!file) return;
  const xml = await file.async("string");
  const changed = change(xml);
  if (changed !== xml) zip.file(name, changed);
}

function megabytes(bytes: number): string {
  return String(Math.ceil(bytes / 1024 / 1024));
}

function firstLine(error: unknown): string {
  return String((error as Error)?.message ?? error).split("\n")[0];
}

/** "1 chart, 2 comments" for the kinds that were removed, or "" when nothing was. */
export function describeDropped(dropped: DroppedParts): string {
  return (Object.entries(dropped) as [DroppedKind, number][])
    .filter(([, n]) => n > 0)
    .map(([kind, n]) => `${n} ${n === 1 ? singular(kind) : kind}`)
    .join(", ");
}

function singular(kind: DroppedKind): string {
  return { charts: "chart", images: "image", comments: "comment", "links to other workbooks": "link to another workbook", "embedded objects": "embedded object" }[kind];
}
