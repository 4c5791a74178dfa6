// ARIMA with missing observations (METHODS §8): at statsmodels' parameters for two stationary
// cases of arima.json (Nile ARMA(1,1) with mean, log lynx AR(2) with mean), with five observations
// removed, the log-likelihood and the forecasts must equal the joint normal density of the observed
// points and the conditional moments of the future given them (scipy multivariate_normal / numpy,
// no filter: test/fixtures/arima/make_arima_gaps.py), and statsmodels 0.13.5 SARIMAX's Kalman
// filter with the gaps in place. Then a fit from scratch through the gaps is no worse than the
// likelihood at statsmodels' full-series parameters.
import * as fs from "fs";
import * as path from "path";
import { fitArima } from "../../src/engine/models/arima/fit";
import { ArimaOrder } from "../../src/engine/models/arima/order";
import { dataset, expectClose } from "../helpers/reference";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Json = any;
const fixture: Json = JSON.parse(fs.readFileSync(path.join(__dirname, "../fixtures/arima/arima_gaps.json"), "utf8"));

function seriesWithGaps(c: Json): number[] {
  const raw = dataset(c.dataset);
  const w = c.transform === "log" ? raw.map(Math.log) : raw.slice();
  for (const g of c.gaps as number[]) w[g] = Number.NaN;
  return w;
}

function orderOf(c: Json): ArimaOrder {
  const [p, d, q] = c.order;
  return { p, d, q, P: 0, D: 0, Q: 0, m: 1, constant: c.trend === "c" };
}

/** statsmodels' intercept c is the AR equation's constant: μ = c / (1 − Σφ). */
function paramsOf(c: Json, o: ArimaOrder): { phi: number[]; Phi: number[]; theta: number[]; Theta: number[]; mu: number; sigma2: number } {
  const q = c.params;
  const phi = Array.from({ length: o.p }, (_, i) => q[`ar.L${i + 1}`]);
  const theta = Array.from({ length: o.q }, (_, i) => q[`ma.L${i + 1}`]);
  const mu = q.intercept / (1 - phi.reduce((s, v) => s + v, 0));
  return { phi, Phi: [], theta, Theta: [], mu, sigma2: q.sigma2 };
}

describe("ARIMA through gaps at statsmodels' parameters", () => {
  for (const c of fixture.cases as Json[]) {
    test(`${c.id}: log-likelihood and forecasts equal the observed points' joint normal (1e-9) and statsmodels SARIMAX with NaN (1e-7)`, () => {
      const o = orderOf(c);
      const m = fitArima(seriesWithGaps(c), o, paramsOf(c, o));
      expectClose(m.loglik, c.exact_llf, { rtol: 1e-9 }, `${c.id} log-likelihood`);
      expectClose(m.loglik, c.statsmodels_llf, { rtol: 1e-7 }, `${c.id} log-likelihood vs statsmodels`);
      m.forecast(fixture.horizon).forEach((s, i) => {
        expectClose(s.mean, c.exact_forecast_mean[i], { rtol: 1e-9 }, `${c.id} mean h=${i + 1}`);
        expectClose(s.sd * s.sd, c.exact_forecast_var[i], { rtol: 1e-9 }, `${c.id} variance h=${i + 1}`);
      });
    });
    test(`${c.id}: fitted through the gaps, the likelihood is at least the one at statsmodels' full-series parameters`, () => {
      const m = fitArima(seriesWithGaps(c), orderOf(c));
      expect(m.loglik).toBeGreaterThanOrEqual(c.exact_llf - 1e-6);
    });
  }
});
