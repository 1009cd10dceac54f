// The worker thread's script (built as dist/simulation-worker.js beside functions.js): it runs one
// simulating cell function per message with the guarded adapter, so a failure comes back as the same
// CellFailure the host's thread would have produced, and nothing throws out of the worker. The task pane's
// simulations (pane-tasks.ts) run here too.
import { guardedPaneTasks } from "./pane-tasks";
import { guarded } from "./registry";
import type { SimulationReply, SimulationRequest } from "./simulation-threads";

const scope = globalThis as unknown as {
  onmessage: ((event: { data: SimulationRequest }) => void) | null;
  postMessage(reply: SimulationReply): void;
};

scope.onmessage = (event) => {
  const { name, args } = event.data;
  const fn = guarded[name] ?? guardedPaneTasks[name];
  const result: SimulationReply["result"] = fn ? fn(...args) : { cellError: "#VALUE!", message: `internal error: no function ${name}` };
  scope.postMessage({ result });
};
