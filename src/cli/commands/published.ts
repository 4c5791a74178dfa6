// fanwise published: the total of a forecast made elsewhere and published as monthly medians and
// central intervals — each row's μ, σ, mean and implied λ, then the total with its assumption.
import { EngineError, publishedTotal, RawCell } from "../../engine";
import { Command, COMMON, IO_OPTIONS } from "../command";
import { emit } from "../output";
import { readInputTable } from "../series-input";

const SYNOPSIS = "fanwise published FILE --median COL --lower COL --upper COL --level P.";
const EXAMPLE = "fanwise published forecast.csv --median median --lower lower95 --upper upper95 --level 95";

const isBlank = (c: RawCell): boolean => c === null || c === undefined || (typeof c === "string" && c.trim() === "");

export const publishedCommand: Command = {
  name: "published",
  summary: "the total of a forecast published as monthly medians and intervals",
  args: "FILE",
  options: {
    median: { type: { kind: "text" }, value: "COL", help: "column of the published medians (point forecasts)", example: "median", required: SYNOPSIS },
    lower: { type: { kind: "text" }, value: "COL", help: "column of the intervals' low ends", example: "lower95", required: SYNOPSIS },
    upper: { type: { kind: "text" }, value: "COL", help: "column of the intervals' high ends", example: "upper95", required: SYNOPSIS },
    level: { ...COMMON.level, help: "the intervals' level in percent (the total's interval has the same level)", example: "95", default: undefined, required: SYNOPSIS },
    lambda: { type: { kind: "text" }, value: "L|implied", help: "Box-Cox λ the forecast was made on, or implied (from the intervals' asymmetry)", example: "implied", default: "0" },
    dependence: { type: { kind: "text" }, value: "implied|independent|comonotone|R", help: "how the months move together: implied from how the intervals widen, independent, comonotone, or a correlation R from 0 to 1", example: "0.5", default: "implied" },
    seed: { type: { kind: "int", min: 0 }, value: "S", help: "seed of the simulated paths (same seed, same result)", example: "7", default: "1" },
    paths: { type: { kind: "int", min: 100 }, value: "P", help: "number of simulated paths", example: "50000", default: "20000" },
    ...IO_OPTIONS,
  },
  details: [
    "Rows are months in order, the first one step ahead; rows blank in all three columns are skipped. The total's mean is the sum of the monthly means (exact for λ ≥ 0); its median and interval come from simulating the months jointly. The independent and comonotone intervals are printed beside the chosen one: the range the published figures allow.",
  ],
  examples: [EXAMPLE, "fanwise published forecast.csv --median median --lower lower80 --upper upper80 --level 80 --lambda implied --dependence comonotone --json"],
  async run(p, io) {
    const level = p.num("level") as number;
    // Rows are read in file order (no calendar), with the shared reader's number formats.
    const read = await readInputTable(p, io, EXAMPLE, { calendar: false });
    const t = read.table;
    const col = (flag: string): RawCell[] => {
      const name = p.text(flag) as string;
      const cells = t.columnNamed(name);
      if (cells === null) throw new EngineError("input", `No column named "${name}" (for --${flag}). Columns: ${t.header.join(", ")}.`);
      return cells;
    };
    const cols = [col("median"), col("lower"), col("upper")];
    const flags = ["median", "lower", "upper"];
    const m: number[] = [];
    const l: number[] = [];
    const u: number[] = [];
    const lines: string[] = [];
    for (let i = 0; i < t.rows; i++) {
      const row = cols.map((c) => c[i]);
      if (row.every(isBlank)) continue;
      row.forEach((v, k) => {
        if (typeof v !== "number") throw new EngineError("input", `${t.where(i).replace(/^./, (c) => c.toUpperCase())}: --${flags[k]} column "${p.text(flags[k])}" ${isBlank(v) ? "is blank" : `is not a number (${JSON.stringify(String(v)).slice(0, 24)})`}; every month needs a median, a lower and an upper end.`);
      });
      m.push(row[0] as number);
      l.push(row[1] as number);
      u.push(row[2] as number);
      lines.push(t.where(i));
    }
    if (m.length === 0) throw new EngineError("input", "The three columns hold no months; check the column names.");
    const lambdaText = p.text("lambda");
    const lambda = lambdaText === undefined ? 0 : lambdaText.trim().toLowerCase() === "implied" ? "implied" : lambdaText;
    let r;
    try {
      r = publishedTotal(m, l, u, level, { lambda, dependence: p.text("dependence"), seed: p.int("seed") ?? 1, paths: p.int("paths") ?? 20000 });
    } catch (e) {
      // "Month 3: …" → name the file's line as well
      if (e instanceof EngineError) throw new EngineError(e.code, e.message.replace(/^Month (\d+):/, (_s, k) => `Month ${k} (${lines[Number(k) - 1]}):`));
      throw e;
    }
    const res = r;
    await emit(io, p, {
      command: "published",
      json: () => ({
        months: res.months.map((mo, i) => ({ line: lineNumber(lines[i]), h: mo.h, median: mo.median, lower: mo.lower, upper: mo.upper, mu: mo.mu, sigma: mo.sigma, mean: mo.mean, impliedLambda: mo.impliedLambda, asymmetry: mo.asymmetry })),
        total: {
          mean: res.mean, meanMethod: res.meanMethod, median: res.median, interval: res.interval, level: res.level,
          lambda: res.lambda, lambdaSource: res.lambdaSource, dependence: res.dependence, used: res.used,
          independent: res.independent.interval, comonotone: res.comonotone.interval,
          fit: { sigma: Math.sqrt(res.fit.sigma2), alpha: res.fit.alpha, rmsRelative: res.fit.rmsRelative, ok: res.fit.ok },
          paths: res.paths, seed: res.seed, monteCarloError: res.monteCarloError, notes: res.notes,
        },
      }),
      header: ["row", "line", "median", "lower", "upper", "mu", "sigma", "mean", "implied_lambda", "low", "high", "independent_low", "independent_high", "comonotone_low", "comonotone_high", "note"],
      rows: () => [
        ...res.months.map((mo, i) => [mo.h, lineNumber(lines[i]), mo.median, mo.lower, mo.upper, mo.mu, mo.sigma, mo.mean, mo.impliedLambda ?? "", "", "", "", "", "", "", ""]),
        ["total", "", res.median, "", "", "", "", res.mean, "", res.interval[0], res.interval[1], res.independent.interval[0], res.independent.interval[1], res.comonotone.interval[0], res.comonotone.interval[1], [`${res.level}% interval; dependence ${res.used}; λ ${res.lambda} (${res.lambdaSource}); mean ${res.meanMethod}.`, ...res.notes].join(" ")],
      ],
      cautions: [...read.notes, ...t.reading.notes, ...res.notes],
    });
    return 0;
  },
};

/** A CSV row's line number ("line 14" → 14); a workbook's place stays as text ("row 14 of sheet …"). */
function lineNumber(where: string): number | string {
  const m = /^line (\d+)$/.exec(where);
  return m ? Number(m[1]) : where;
}
