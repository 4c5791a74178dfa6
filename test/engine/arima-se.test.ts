// Standard errors of the fitted ARIMA coefficients against statsmodels 0.13.5 SARIMAX's
// numerical-Hessian standard errors (cov_type="approx", recorded as bse_approx in
// test/fixtures/arima/arima.json), where both fits reach the same optimum (log-likelihoods within
// 1e-3; on the Nile ARMA(1,1) Fanwise's fit is 1.08 higher, φ 0.86 against 0.66, so the errors are of
// different points and that case only checks they exist). Both Hessians are finite differences,
// so agreement is asked to 5%.
import * as fs from "fs";
import * as path from "path";
import { fitArima } from "../../src/engine/models/arima/fit";
import { dataset } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any;
const fixture: Json = JSON.parse(fs.readFileSync(path.join(__dirname, "../fixtures/arima/arima.json"), "utf8"));

/** statsmodels' coefficient names → ours (the intercept and σ² are left out: parametrised differently). */
function ours(name: string): string | null {
  const m = /^(ar|ma)\.(S\.)?L(\d+)$/.exec(name);
  if (!m) return null;
  return `${m[2] ? "s" : ""}${m[1]}`;
}

describe("ARIMA coefficient standard errors", () => {
  for (const c of fixture.cases as Json[]) {
    test(`${c.id}: within 5% of statsmodels' approx standard errors`, () => {
      const raw = dataset(c.dataset);
      const w = c.transform === "log" ? raw.map(Math.log) : raw;
      const [p, d, q] = c.order;
      const [P, D, Q, m] = c.seasonal_order;
      const model = fitArima(w, { p, d, q, P, D, Q, m: m || 1, constant: c.trend === "c" });
      const se = model.standardErrors as Record<string, number>;
      expect(se).not.toBeNull();
      if (Math.abs(model.loglik - c.llf) > 1e-3) {
        expect(model.loglik).toBeGreaterThan(c.llf);
        expect(Object.values(se).every((v) => Number.isFinite(v) && v > 0)).toBe(true);
        return;
      }
      const count: Record<string, number> = {};
      let compared = 0;
      for (const [name, v] of Object.entries(c.bse_approx as Record<string, number>)) {
        const base = ours(name);
        if (!base) continue;
        count[base] = (count[base] ?? 0) + 1;
        const key = `${base}${count[base]}`;
        expect(Math.abs(se[key] - v) / v).toBeLessThan(0.05);
        compared++;
      }
      expect(compared).toBeGreaterThan(0);
    });
  }
});
