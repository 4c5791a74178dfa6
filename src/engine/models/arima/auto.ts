// Automatic seasonal ARIMA: differencing chosen by unit-root tests (Canova & Hansen 1995 for the
// seasonal difference D, then KPSS — Kwiatkowski et al. 1992 — repeated for d), then a stepwise
// search over the ARMA orders by AICc, as described by Hyndman & Khandakar (2008, J. Statistical
// Software 27(3), §3.2): start from four models, try every variation of the current one (each of
// p, q, P, Q by ±1; p and q together; P and Q together; the constant in or out) and move to the
// best variation while it lowers the AICc. Written from the paper's description.
import { EngineError } from "../../errors";
import { fitArima, ArimaModel } from "./fit";
import { ArimaOrder, ARIMA_LIMITS, arimaTitle } from "./order";
import { applyDifference, differencingPolynomial } from "./polynomial";
import { canovaHansen, kpss } from "./unit-root";

/** The outcome of the automatic search. */
export interface ArimaSearch {
  model: ArimaModel;
  /** Orders fitted during the search, with their AICc (Infinity where the fit failed). */
  tried: { order: ArimaOrder; aicc: number }[];
  /** How d and D were chosen, in words. */
  notes: string[];
}

/** Largest total ARMA order searched (p + q + P + Q), as in Hyndman & Khandakar's default. */
export const MAX_TOTAL_ORDER = 5;
/** Most models the search fits before it stops with the best so far. */
export const MAX_MODELS = 60;

/**
 * Chooses d, D and the ARMA orders automatically and returns the best model by AICc.
 * `m` is the period (1 = not seasonal).
 * @example autoArima(logAirPassengers, 12).model.title // "ARIMA(…)(0,1,1)[12]"-like
 */
export function autoArima(w: readonly number[], m: number): ArimaSearch {
  const notes: string[] = [];
  let D = 0;
  const seasonal = m >= 2 && m < w.length;
  if (m >= 2 && !seasonal) notes.push(`Period ${m} is not shorter than the series (${w.length} values): no seasonal terms were tried.`);
  if (seasonal) {
    const ch = canovaHansen(w, m);
    if (ch === null) notes.push(`Seasonal difference not tested (fewer than ${3 * m} values): D = 0.`);
    else {
      D = ch.reject5 ? 1 : 0;
      notes.push(`Canova–Hansen seasonal test: L = ${ch.stat.toFixed(3)} ${ch.reject5 ? ">" : "≤"} ${ch.critical} (5%), so D = ${D}.`);
    }
  }
  let x = D ? applyDifference(w, differencingPolynomial(0, 1, m)) : w.slice();
  let d = 0;
  for (; d < ARIMA_LIMITS.d; d++) {
    const observed = x.filter((v) => v === v).length;
    if (observed < 8) break;
    const k = kpss(x);
    if (!k.reject5) { notes.push(`KPSS after ${d} difference${d === 1 ? "" : "s"}: ${k.stat.toFixed(3)} ≤ 0.463 (5%), so d = ${d}.`); break; }
    notes.push(`KPSS after ${d} difference${d === 1 ? "" : "s"}: ${k.stat.toFixed(3)} > 0.463 (5%): difference again.`);
    x = applyDifference(x, [1, -1]);
  }
  const mm = seasonal ? m : 1;
  const allowConstant = d + D <= 1;
  const tried: { order: ArimaOrder; aicc: number }[] = [];
  const cache = new Map<string, ArimaModel | null>();
  const key = (o: ArimaOrder): string => `${o.p},${o.q},${o.P},${o.Q},${o.constant ? 1 : 0}`;
  const attempt = (o: ArimaOrder): ArimaModel | null => {
    const k = key(o);
    if (cache.has(k)) return cache.get(k) ?? null;
    if (cache.size >= MAX_MODELS) return null;
    let model: ArimaModel | null = null;
    try {
      model = fitArima(w, o, undefined, false);
      if (!Number.isFinite(model.aicc)) model = null;
    } catch {
      model = null;
    }
    cache.set(k, model);
    tried.push({ order: o, aicc: model ? model.aicc : Infinity });
    return model;
  };
  const make = (p: number, q: number, P: number, Q: number, constant: boolean): ArimaOrder => ({ p, d, q, P: seasonal ? P : 0, D, Q: seasonal ? Q : 0, m: mm, constant });
  const valid = (o: ArimaOrder): boolean =>
    o.p >= 0 && o.q >= 0 && o.P >= 0 && o.Q >= 0 && o.p <= ARIMA_LIMITS.p && o.q <= ARIMA_LIMITS.q &&
    o.P <= ARIMA_LIMITS.P && o.Q <= ARIMA_LIMITS.Q && o.p + o.q + o.P + o.Q <= MAX_TOTAL_ORDER && (allowConstant || !o.constant);
  const starts = [make(2, 2, 1, 1, allowConstant), make(0, 0, 0, 0, allowConstant), make(1, 0, 1, 0, allowConstant), make(0, 1, 0, 1, allowConstant)];
  if (allowConstant) starts.push(make(0, 0, 0, 0, false));
  let best: ArimaModel | null = null;
  for (const o of starts) {
    if (!valid(o)) continue;
    const fit = attempt(o);
    if (fit && (!best || fit.aicc < best.aicc)) best = fit;
  }
  if (!best) throw new EngineError("input", `No ARIMA model could be fitted with d = ${d}, D = ${D} (the series may be too short: ${w.length} values). Try a given order such as "arima:0,1,1" or another method.`);
  for (;;) {
    const o = best.order;
    const variations: ArimaOrder[] = [];
    for (const dp of [-1, 1]) {
      variations.push({ ...o, p: o.p + dp }, { ...o, q: o.q + dp }, { ...o, p: o.p + dp, q: o.q + dp });
      if (seasonal) variations.push({ ...o, P: o.P + dp }, { ...o, Q: o.Q + dp }, { ...o, P: o.P + dp, Q: o.Q + dp });
    }
    if (allowConstant) variations.push({ ...o, constant: !o.constant });
    let next: ArimaModel | null = null;
    for (const v of variations) {
      if (!valid(v)) continue;
      const fit = attempt(v);
      if (fit && fit.aicc < (next ?? best).aicc - 1e-9) next = fit;
    }
    if (!next) break;
    best = next;
    if (cache.size >= MAX_MODELS) { notes.push(`The search stopped after ${MAX_MODELS} models with the best so far.`); break; }
  }
  notes.push(`Stepwise search by AICc (Hyndman & Khandakar 2008): ${tried.length} models tried; ${arimaTitle(best.order)} has the lowest AICc.`);
  // The chosen model again, with the standard errors of its coefficients (skipped during the search).
  return { model: fitArima(w, best.order), tried, notes };
}
