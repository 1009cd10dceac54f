/**
 * The functions' descriptions for the explanation: functions.json, which the
 * build writes next to the pane (the host reads the same file). Loaded once;
 * without it the explanation still evaluates, naming arguments by position.
 */
import type { FunctionMetadata } from "../../functions/metadata";

let loaded: Promise<FunctionMetadata[] | null> | null = null;

export function loadMetadata(): Promise<FunctionMetadata[] | null> {
  loaded ??= fetch("./functions.json")
    .then((r) => (r.ok ? r.json() : null))
    .then((json) => (json && Array.isArray(json.functions) ? (json.functions as FunctionMetadata[]) : null))
    .catch(() => null);
  return loaded;
}
