// fanwise audit: did published intervals cover the actuals as often as their level says?
import { EngineError, auditCoverage } from "../../engine";
import { Command, COMMON } from "../command";
import { emit } from "../output";
import { readTable } from "../series-input";

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
    sheet: COMMON.sheet,
    range: COMMON.range,
    json: COMMON.json,
    digits: COMMON.digits,
    out: COMMON.out,
  },
  examples: ["fanwise audit forecast-log.csv --actual actual --lower lower80 --upper upper80 --level 80"],
  async run(p, io) {
    const level = p.num("level") as number;
    const t = await readTable(p, io, "fanwise audit forecast-log.csv --actual actual --lower lower80 --upper upper80 --level 80");
    const col = (flag: string) => {
      const name = p.text(flag) as string;
      const j = t.header.indexOf(name);
      if (j < 0) throw new EngineError("input", `No column named "${name}" (for --${flag}). Columns: ${t.header.join(", ")}.`);
      return t.cells(j);
    };
    const a = auditCoverage(col("actual"), col("lower"), col("upper"), level, 2);
    await emit(io, p, {
      command: "audit",
      json: () => ({
        n: a.n, misses: a.misses, coverage: a.coverage,
        kupiec: { lr: a.kupiec.lr, p: a.kupiec.p }, independence: { lr: a.independence.lr, p: a.independence.p }, conditional: { lr: a.conditional.lr, p: a.conditional.p },
        binomialTail: a.binomialTail, intervalScore: a.intervalScore,
        level, skipped: a.skipped, zone: a.zone, verdict: a.verdict,
      }),
      header: ["n", "misses", "coverage", "nominal", "kupiec_lr", "kupiec_p", "independence_lr", "independence_p", "conditional_lr", "conditional_p", "binomial_tail", "interval_score", "zone", "verdict"],
      rows: () => [[a.n, a.misses, a.coverage, a.nominal, a.kupiec.lr, a.kupiec.p, a.independence.lr, a.independence.p, a.conditional.lr, a.conditional.p, a.binomialTail, a.intervalScore, a.zone, a.verdict]],
      exact: ["skipped"],
      formats: { coverage: "0.0%", nominal: "0.0%", kupiec_p: "0.0000", independence_p: "0.0000", conditional_p: "0.0000", binomial_tail: "0.0000" },
      cautions: t.notes,
    });
    return 0;
  },
};
