// fanwise audit: did published intervals cover the actuals as often as their level says?
import { EngineError, auditCoverage } from "../../engine";
import { readCsvFile } from "../csv-file";
import { DecimalMark, parseDelimiterOption, readTable } from "../../io";
import { Command, COMMON } from "../command";
import { writeOutput } from "../output";
import { fileArgument } from "../series-input";

const SYNOPSIS = "fanwise audit FILE --actual COL --lower COL --upper COL --level P.";

export const auditCommand: Command = {
  name: "audit",
  summary: "check published intervals against actuals: coverage, misses and tests",
  args: "FILE",
  options: {
    actual: { type: { kind: "text" }, value: "COL", help: "column of actual values", example: "actual", required: SYNOPSIS },
    lower: { type: { kind: "text" }, value: "COL", help: "column of interval low ends", example: "lower80", required: SYNOPSIS },
    upper: { type: { kind: "text" }, value: "COL", help: "column of interval high ends", example: "upper80", required: SYNOPSIS },
    level: { ...COMMON.level, help: "the intervals' level in percent", example: "80", default: undefined, required: SYNOPSIS },
    delimiter: COMMON.delimiter,
    decimal: COMMON.decimal,
    json: COMMON.json,
  },
  examples: ["fanwise audit forecast-log.csv --actual actual --lower lower80 --upper upper80 --level 80"],
  run(p, io) {
    const level = p.num("level") as number;
    // A forecast log repeats periods (one row per forecast), so no calendar is read from it.
    const d = p.text("delimiter");
    const file = readCsvFile(fileArgument(p, "fanwise audit forecast-log.csv --actual actual --lower lower80 --upper upper80 --level 80"), d === undefined ? undefined : parseDelimiterOption(d));
    const t = readTable(file, { calendar: false, decimal: p.choice("decimal") as DecimalMark | undefined });
    const col = (flag: string) => {
      const name = p.text(flag) as string;
      const cells = t.columnNamed(name);
      if (cells === null) throw new EngineError("input", `No column named "${name}" (for --${flag}). Columns: ${t.header.join(", ")}.`);
      return cells;
    };
    const a = auditCoverage(col("actual"), col("lower"), col("upper"), level, 2);
    writeOutput(io, p.has("json"), {
      json: () => ({
        n: a.n, misses: a.misses, coverage: a.coverage,
        kupiec: { lr: a.kupiec.lr, p: a.kupiec.p }, independence: { lr: a.independence.lr, p: a.independence.p }, conditional: { lr: a.conditional.lr, p: a.conditional.p },
        binomialTail: a.binomialTail, intervalScore: a.intervalScore,
        level, skipped: a.skipped, zone: a.zone, verdict: a.verdict,
      }),
      header: ["n", "misses", "coverage", "nominal", "kupiec_lr", "kupiec_p", "independence_lr", "independence_p", "conditional_lr", "conditional_p", "binomial_tail", "interval_score", "zone", "verdict"],
      rows: () => [[a.n, a.misses, a.coverage, a.nominal, a.kupiec.lr, a.kupiec.p, a.independence.lr, a.independence.p, a.conditional.lr, a.conditional.p, a.binomialTail, a.intervalScore, a.zone, a.verdict]],
    });
    return 0;
  },
};
