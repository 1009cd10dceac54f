/**
 * Save and reopen a check as a `*.check.json` file, through the core's
 * writer and reader (src/design/check-file.ts): the file holds every input
 * of the form, test data included, and `brittle check FILE` reruns it. A
 * file the reader refuses leaves the form as it was and says which field of
 * the file is wrong.
 */
import type { CheckDescription } from "../../src/design/check-description";
import { parseCheckFileBytes, serializeCheckFile } from "../../src/design/check-file";
import { FieldError } from "../app/dom";
import { fillForm } from "../steps/fill-form";
import { downloadText } from "./download";

/** "Bracket B-12 rev 3" -> "bracket-b-12-rev-3.check.json"; no title -> "design.check.json". */
export function checkFileName(title: string | undefined): string {
  const slug = (title ?? "")
    .normalize("NFKD")
    .replace(/[^\w\s-]/g, "")
    .trim()
    .toLowerCase()
    .replace(/[\s_]+/g, "-")
    .replace(/-+/g, "-")
    .slice(0, 60)
    .replace(/^-|-$/g, "");
  return `${slug || "design"}.check.json`;
}

export function saveCheckFile(description: CheckDescription): string {
  const name = checkFileName(description.title);
  downloadText(name, serializeCheckFile(description), "application/json");
  return name;
}

export type OpenOutcome = { ok: true; name: string } | { ok: false; message: string; fieldId: string | null };

/** Read a chosen file into the form; the form is untouched unless the whole file reads and fills. */
export async function openCheckFile(file: File): Promise<OpenOutcome> {
  let description: CheckDescription;
  try {
    description = parseCheckFileBytes(new Uint8Array(await file.arrayBuffer()));
  } catch (error) {
    return { ok: false, message: `${file.name} was not opened: ${error instanceof Error ? error.message : String(error)}. The form is unchanged.`, fieldId: null };
  }
  try {
    fillForm(description);
  } catch (error) {
    if (error instanceof FieldError) {
      return { ok: false, message: `${file.name} was not opened: ${error.message} The form is unchanged.`, fieldId: error.fieldId };
    }
    throw error;
  }
  return { ok: true, name: file.name };
}
