// The functions script the manifest names: with the shared runtime the task
// pane page registers the functions itself, and this file does the same when a
// host loads the script on its own.
import { registerInHost } from "./office";

registerInHost();
