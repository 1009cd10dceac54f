/**
 * Task pane entry. With the shared runtime this page also hosts the custom
 * functions, so it registers them first; outside a spreadsheet host
 * (a plain browser) Office.onReady resolves with host null and the page runs
 * standalone.
 */
import { registerInHost } from "../functions/office";

const status = document.getElementById("status");

function show(text: string): void {
  if (status) status.textContent = text;
}

registerInHost();

if (typeof Office !== "undefined") {
  Office.onReady((info) => {
    show(info.host ? `Ready in ${String(info.host)}: BRITTLE functions are registered.` : "Ready (standalone: no spreadsheet host).");
    document.body.dataset.ready = "true";
  });
} else {
  show("Ready (standalone: office.js not loaded).");
  document.body.dataset.ready = "true";
}
