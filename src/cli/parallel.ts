// Series by series over every core (--jobs): the main thread reads the file and writes the output;
// worker threads (node:worker_threads, running the compiled build/cli/series-worker.js) compute
// one series each, with the same code as the serial path, so the output is byte-equal to --jobs 1.
// Results come back in the file's order, and only a bounded window of them is held at a time.
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { Worker } from "worker_threads";
import { EngineError, EngineErrorCode, RawCell } from "../engine";
import { ParsedArgs, usageError } from "./options";
import { PeriodChoice } from "./series-input";
import { SeriesData } from "./table";

/**
 * Fewer series than this run on one thread by default: a worker thread's start (loading the engine:
 * 1.4–2.2 s of CPU, about 100 `auto` fits of 120 months since the fits follow their gradient) is
 * not repaid by a few series. Measured on 2 cores (bench/README.md, "where two threads start to
 * pay"): `--jobs 2` was slower at 50 and 100 series, about even at 150–200, 1.22× faster at 300.
 */
export const PARALLEL_MIN_SERIES = 200;

/** The --jobs option, shared by the commands that work series by series. */
export const JOBS_OPTION = {
  type: { kind: "int" as const, min: 1 },
  value: "N",
  help: `worker threads for the series (1: one after another; default: every core when there are at least ${PARALLEL_MIN_SERIES} series); the output is the same`,
  example: "2",
  default: `every core from ${PARALLEL_MIN_SERIES} series`,
};

/**
 * How many worker threads to use: --jobs when given (at most one per series), else every core
 * when there are at least PARALLEL_MIN_SERIES series, else 1 (the serial path).
 * @example jobsFor(parsed, 500) // 2 on a 2-core machine
 */
export function jobsFor(p: ParsedArgs, count: number): number {
  const given = p.int("jobs");
  if (given !== undefined) return Math.max(1, Math.min(given, count));
  const cores = typeof os.availableParallelism === "function" ? os.availableParallelism() : os.cpus().length;
  return count >= PARALLEL_MIN_SERIES ? Math.max(1, Math.min(cores, count)) : 1;
}

/** One series sent to a worker: its cells and the place of each row (for messages). */
export interface SeriesTask {
  j: number;
  name: string;
  cells: RawCell[];
  where: string[];
}

/** What a worker needs to compute like the main thread: the command, its arguments and the file's period. */
export interface WorkerSetup {
  command: string;
  argv: string[];
  period: PeriodChoice;
}

/** A worker's answer for one series. */
export type WorkerReply =
  | { j: number; ok: true; result: unknown }
  | { j: number; ok: false; code?: EngineErrorCode; message: string };

/**
 * Series j of a file as a one-series file (what a worker computes on): the same cells, name,
 * period and places of rows as in the whole file.
 * @example oneSeries(task, setup.period).column(0) // task.cells
 */
export function oneSeries(task: SeriesTask, period: PeriodChoice): SeriesData {
  return {
    names: [task.name],
    column: () => task.cells,
    labelColumn: null,
    line: () => null,
    where: (i) => task.where[i] ?? `row ${i + 1}`,
    rows: task.cells.length,
    calendar: null,
    next: null,
    period: period.period,
    periodFrom: period.periodFrom === "dates" ? "dates" : "default",
    reading: { delimiter: ",", delimiterFrom: "default", dates: null, columns: {}, leftOut: [], ignored: [], notes: [] },
    columnNamed: () => null,
    header: [],
    notes: [],
  };
}

/** The compiled worker script (the build, also when the caller runs from the TypeScript sources). */
function workerScript(): string | null {
  const here = path.join(__dirname, "series-worker.js");
  if (fs.existsSync(here)) return here;
  const built = path.resolve(__dirname, "..", "..", "build", "cli", "series-worker.js");
  return fs.existsSync(built) ? built : null;
}

/**
 * The results of every series of `data`, in order: computed by `local` one after another with
 * `jobs` 1, else by the main thread and `jobs` − 1 worker threads running the command's per-series
 * function on the same cells (the main thread computes the next series itself whenever the one to
 * write is not back yet, so it is never idle and one thread's start is saved). At most a window of
 * 8 × jobs results is held ahead of the one being written. A series whose cells cannot be read is
 * computed here (its message is the same). An error thrown for a series (a usage error, the same
 * for every series) is thrown when that series' turn comes, as serially.
 * @example for await (const r of inOrder(parsed, "fan", data, 2, (j) => fanOne(parsed, data, j))) write(r)
 */
export async function* inOrder<R>(p: ParsedArgs, command: string, data: SeriesData, jobs: number, local: (j: number) => R): AsyncGenerator<R> {
  const count = data.names.length;
  const script = jobs > 1 ? workerScript() : null;
  if (jobs <= 1 || count === 0 || script === null) {
    for (let j = 0; j < count; j++) yield local(j);
    return;
  }
  const setup: WorkerSetup = { command, argv: p.argv, period: { period: data.period, periodFrom: data.periodFrom } };
  const workers = Array.from({ length: jobs - 1 }, () => new Worker(script, { workerData: setup }));
  /** Finished series waiting for their turn: a worker's reply, or the main thread's own result or error. */
  const done = new Map<number, { reply?: WorkerReply; value?: R; thrown?: unknown; here?: boolean }>();
  const window = 8 * jobs;
  let next = 0; // next series to hand out
  let written = 0; // next series to yield
  let failure: Error | null = null;
  let wake: (() => void) | null = null;
  const busy = new Map<Worker, number>();
  const notify = (): void => {
    const w = wake;
    wake = null;
    if (w) w();
  };
  const taskOf = (j: number): SeriesTask | null => {
    let cells: RawCell[];
    try {
      cells = data.column(j);
    } catch {
      return null; // unreadable cells: computed here, with the same message
    }
    return { j, name: data.names[j], cells, where: Array.from({ length: cells.length }, (_, i) => data.where(i, j)) };
  };
  const feed = (w: Worker): void => {
    while ((busy.get(w) ?? 0) < 2 && next < count && next < written + window) {
      const j = next++;
      const task = taskOf(j);
      if (task === null) { done.set(j, { here: true }); continue; }
      busy.set(w, (busy.get(w) ?? 0) + 1);
      w.postMessage(task);
    }
  };
  const computeHere = (j: number): void => {
    try {
      done.set(j, { value: local(j) });
    } catch (e) {
      done.set(j, { thrown: e });
    }
  };
  for (const w of workers) {
    busy.set(w, 0);
    w.on("message", (reply: WorkerReply) => {
      busy.set(w, (busy.get(w) ?? 1) - 1);
      done.set(reply.j, { reply });
      feed(w);
      notify();
    });
    w.on("error", (e) => { failure = e; notify(); });
    w.on("exit", (code) => { if (code !== 0 && !failure) failure = new Error(`a worker thread stopped (exit code ${code})`); notify(); });
  }
  try {
    for (const w of workers) feed(w);
    while (written < count) {
      const got = done.get(written);
      if (!got) {
        if (failure) throw failure;
        if (next < count && next < written + window) {
          computeHere(next++);
          // let the workers' replies in before going on
          await new Promise<void>((resolve) => setImmediate(resolve));
        } else {
          await new Promise<void>((resolve) => { wake = resolve; });
        }
        continue;
      }
      done.delete(written);
      const j = written++;
      for (const w of workers) feed(w);
      if (got.here) yield local(j);
      else if ("thrown" in got) throw got.thrown;
      else if (!got.reply) yield got.value as R;
      else if (got.reply.ok) yield got.reply.result as R;
      else if (got.reply.code) throw new EngineError(got.reply.code, got.reply.message);
      else throw new Error(got.reply.message);
    }
  } finally {
    for (const w of workers) w.removeAllListeners("exit");
    await Promise.all(workers.map((w) => w.terminate()));
  }
}

/**
 * Refuses --jobs where it cannot apply (a usage error naming what works).
 * @example refuseJobs(parsed, "--across adds up all series at once") // throws when --jobs was given
 */
export function refuseJobs(p: ParsedArgs, why: string): void {
  if (p.has("jobs") && p.int("jobs") !== 1) throw usageError(`--jobs cannot be used here: ${why}. Leave --jobs out (or give --jobs 1).`);
}
