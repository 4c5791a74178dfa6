// A worker thread of --jobs (see parallel.ts): parses the command's arguments like the main thread,
// then computes each series it is sent with the command's own per-series function, and replies
// with the result (or the message of an error the serial path would throw).
import { parentPort, workerData } from "worker_threads";
import { isEngineError } from "../engine";
import { COMMANDS } from "./commands";
import { PER_SERIES } from "./commands/per-series";
import { parseOptions } from "./options";
import { oneSeries, SeriesTask, WorkerReply, WorkerSetup } from "./parallel";

const setup = workerData as WorkerSetup;
const command = COMMANDS.find((c) => c.name === setup.command);
const compute = PER_SERIES[setup.command];
if (!parentPort || !command || !compute) throw new Error(`series-worker: no per-series function for "${setup.command}"`);
const p = parseOptions(command.name, setup.argv, command.options);
const port = parentPort;

port.on("message", (task: SeriesTask) => {
  let reply: WorkerReply;
  try {
    reply = { j: task.j, ok: true, result: compute(p, oneSeries(task, setup.period), 0, task.j) };
  } catch (e) {
    reply = isEngineError(e) ? { j: task.j, ok: false, code: e.code, message: e.message } : { j: task.j, ok: false, message: e instanceof Error ? e.message : String(e) };
  }
  port.postMessage(reply);
});
