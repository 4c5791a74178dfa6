// fanwise lambda: the λ of each series — by default exactly the λ a forecast with --lambda auto
// uses (readable λ and form together by original-scale AICc), or the model's own maximum, or
// Guerrero's method, or the i.i.d. profile likelihood — each with the interval that belongs to it.
import { EngineError, autoShift, fitLambda, fitLambdaForModel, LambdaChoice, parseShift, screenSeries } from "../../engine";
import { Command, COMMON, SERIES_IO_OPTIONS } from "../command";
import { ParsedArgs } from "../options";
import { exitCode, seriesError } from "../output";
import { inOrder, jobsFor, JOBS_OPTION } from "../parallel";
import { cleanSeriesAtLines, errorMessage, lineOf, periodOf, readAllColumns, readSeriesFile, reportReading, ZEROS_OPTION_CLI, zerosOf } from "../series-input";
import { emitSeries } from "../stream-output";
import { SeriesData } from "../table";

export const lambdaCommand: Command = {
  name: "lambda",
  summary: "estimate the Box-Cox λ of each series, with its interval",
  args: "FILE",
  options: {
    method: { type: { kind: "choice", values: ["auto", "model", "guerrero", "mle"] }, value: "auto|model|guerrero|mle", help: "auto: the λ --lambda auto uses; model: the forecasting model's own maximum-likelihood λ; guerrero; mle (i.i.d. profile likelihood)", example: "model", default: "auto" },
    period: COMMON.period,
    transform: { ...COMMON.transform, type: { kind: "choice", values: ["box-cox", "yeo-johnson"] }, value: "box-cox|yeo-johnson" },
    shift: COMMON.shift,
    bounds: { type: { kind: "pair" }, value: "LO,HI", help: "search λ between these two numbers", example: "-1,2", default: "-1,2" },
    zeros: COMMON.zeros,
    ...SERIES_IO_OPTIONS,
    jobs: JOBS_OPTION,
  },
  examples: ["fanwise lambda sales.csv --period 12", "fanwise lambda sales.csv --method mle --json"],
  async run(p, io) {
    const method = p.choice("method") ?? "auto";
    parseShift(p.text("shift")); // a bad --shift is a usage error, before the file is read
    const data = await readSeriesFile(p, io);
    const { period, periodFrom } = periodOf(p, data);
    const failed: { name: string; message: string }[] = [];
    let ok = 0;
    await emitSeries<SeriesLambda>(io, p, {
      command: "lambda",
      header: ["series", "lambda", "method", "interval_low", "interval_high", "readable_lambda", "loglik", "on_bound", "note"],
      exact: ["readable_lambda"],
      head: () => {
        readAllColumns(data);
        return { reading: data.reading };
      },
      entry: (x) => [x.name, x.ok
        ? { lambda: x.r.lambda, method: x.r.method, interval: x.r.interval, loglik: x.r.loglik, readable: x.r.readable, onBound: x.r.onBound, window: x.r.window, n: x.r.n, missing: x.r.missing, note: x.r.note, period, periodFrom }
        : { error: x.message }],
      rows: (x) => [x.ok
        ? [x.name, x.r.lambda, x.r.method, x.r.interval[0], x.r.interval[1], x.r.readable, x.r.loglik, x.r.onBound ?? "", x.r.note]
        : [x.name, "", method, "", "", "", "", "", x.message]],
      workbook: (all) => ({
        formats: { lambda: "0.0000", interval_low: "0.0000", interval_high: "0.0000", readable_lambda: "0.00", loglik: "0.000" },
        cautions: [...data.notes, ...all.flatMap((x) => (x.ok ? [] : [`${x.name}: ${x.message}`]))],
      }),
    }, inOrder(p, "lambda", data, jobsFor(p, data.names.length), (j) => lambdaOne(p, data, j)), (x) => {
      if (x.ok) ok++;
      else failed.push({ name: x.name, message: x.message });
    });
    for (const x of failed) seriesError(io, x.name, x.message);
    reportReading(io, p.has("json"), data);
    return exitCode(ok, failed.length);
  },
};

/** One series' λ, or its message. */
export type SeriesLambda = { name: string; ok: true; r: LambdaChoice } | { name: string; ok: false; message: string };

/**
 * The λ of series j of the file with lambda's options (--method, --transform, --shift, --bounds,
 * --period, --zeros), or its message.
 * @example lambdaOne(parsed, data, 0) // { name: "Harbour Street", ok: true, r: { lambda: 0, … } }
 */
export function lambdaOne(p: ParsedArgs, data: SeriesData, j: number): SeriesLambda {
  const method = p.choice("method") ?? "auto";
  const kind = (p.choice("transform") ?? "box-cox") as "box-cox" | "yeo-johnson";
  const shiftSpec = parseShift(p.text("shift"));
  const [lower, upper] = p.pair("bounds") ?? [undefined, undefined];
  const { period } = periodOf(p, data);
  const name = data.names[j];
  try {
    const cells = data.column(j);
    if (kind === "box-cox" && shiftSpec === 0) {
      const screen = screenSeries(cells, { period, label: name, where: lineOf(data, j), zeros: zerosOf(p), zerosOption: ZEROS_OPTION_CLI });
      if (!screen.boxCoxUsable) throw new EngineError("input", screen.message);
    }
    const clean = cleanSeriesAtLines(cells, data, j, zerosOf(p));
    const shift = kind === "box-cox" ? (shiftSpec === "auto" ? autoShift(clean.values) : shiftSpec) : 0;
    let r: LambdaChoice;
    if (method === "auto" || method === "model") {
      r = fitLambdaForModel(clean.values, { kind, shift, period, label: name, lambdaMethod: method });
    } else {
      if (kind !== "box-cox") throw new EngineError("input", `--method ${method} is defined for Box-Cox; with --transform yeo-johnson use --method auto or model.`);
      const y = clean.values.map((v) => v + shift);
      if (y.some((v) => !Number.isNaN(v) && !(v > 0))) throw new EngineError("input", `${name} has values ≤ 0 after the shift ${shift}; use --shift auto or --transform yeo-johnson.`);
      r = fitLambda(y, { method: method as "guerrero" | "mle", period, lower, upper, label: name });
    }
    return { name, ok: true, r };
  } catch (e) {
    return { name, ok: false, message: errorMessage(e) };
  }
}
