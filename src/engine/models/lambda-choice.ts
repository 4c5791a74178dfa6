// λ under the forecasting model itself: the original-scale likelihood (with the Jacobian), the
// `auto` rule (readable λ and the smoothing form together, by original-scale AICc) and the `model`
// method (the profile of the chosen model's likelihood over λ, with its likelihood-ratio interval).
// METHODS §7; Box & Cox (1964) for the Jacobian and the profile argument.
import { EngineError } from "../errors";
import { fmt } from "../_lib/check";
import { findRoot, minimizeBounded } from "../_lib/brent";
import { chiSquareQuantile } from "../distribution/chisquare";
import type { LambdaChoice } from "../transform/fit-lambda";
import { READABLE_LAMBDAS } from "../transform/readable";
import { requirePositiveSeries } from "../series/positive";
import { boundHit } from "../transform/bounds";
import { logJacobian, makeTransform, TransformKind, TransformSpec, transformForward } from "../transform/spec";
import { fitBenchmark } from "./benchmarks";
import { fitSmoothing } from "./ets";
import { isBenchmark, MethodName, SmoothingMethod } from "./methods";
import { isArimaMethod, parseArimaMethod } from "./arima/order";
import { fitArima } from "./arima/fit";
import { autoArima } from "./arima/auto";
import { fitAuto } from "./select";
import type { AutoChoice } from "./select";
import type { FittedModel } from "./types";

/**
 * λ is chosen on at most this many of the latest values (each candidate is a full model fit; on a
 * longer series the choice would take minutes). The note says so when it applies (common practice:
 * the recent past is what the forecast continues).
 */
export const LAMBDA_CHOICE_MAX = 2000;

function recent(y: readonly number[]): readonly number[] {
  return y.length > LAMBDA_CHOICE_MAX ? y.slice(y.length - LAMBDA_CHOICE_MAX) : y;
}

function sampleNote(n: number): string {
  return n > LAMBDA_CHOICE_MAX ? ` λ was chosen on the latest ${LAMBDA_CHOICE_MAX.toLocaleString("en-US")} of ${n.toLocaleString("en-US")} values.` : "";
}

/** A model's fit on the original scale. */
export interface OriginalScaleFit {
  /** ℓ(y) = ℓ(w) + Σ ln|g′(y_t)| over the observations the likelihood covers. */
  loglik: number;
  /** AICc from ℓ(y), counting λ as a parameter when it was estimated. */
  aicc: number;
  /** Parameters counted (the model's own, + 1 for an estimated λ). */
  k: number;
  /** The Jacobian term Σ ln|g′(y_t)|. */
  jacobian: number;
}

/**
 * AICc = −2ℓ + 2k + 2k(k + 1)/(n − k − 1) (Hurvich & Tsai 1989).
 * @example aiccOf(-10, 2, 20) // 24.705882352941178
 */
export function aiccOf(loglik: number, k: number, n: number): number {
  return -2 * loglik + 2 * k + (2 * k * (k + 1)) / Math.max(n - k - 1, 1e-9);
}

/**
 * The Jacobian term Σ ln|g′(y_t)| over the last `count` observations (those a model's likelihood
 * covers: all of them for smoothing, all but the first for naive, …), skipping missing values.
 * @example jacobianOf([1, Math.E], makeTransform("box-cox", 0), 2) // -1
 */
export function jacobianOf(y: readonly number[], t: TransformSpec, count: number): number {
  let s = 0;
  for (let i = Math.max(0, y.length - count); i < y.length; i++) if (Number.isFinite(y[i])) s += logJacobian(t, y[i]);
  return s;
}

/**
 * A model fitted to w = g(y) seen on the original scale: ℓ(y) = ℓ(w) + Σ ln|g′(y_t)| (Box & Cox
 * 1964; METHODS §7), so AICc compares fits with different λ, or none, on the same data.
 * @example originalScaleFit(fitSmoothing(logAir, "ses", 1), air, makeTransform("box-cox", 0), false).loglik // ℓ(w) − Σ ln y
 */
export function originalScaleFit(model: FittedModel, y: readonly number[], t: TransformSpec, lambdaEstimated: boolean): OriginalScaleFit {
  const count = model.residuals.length;
  const jacobian = jacobianOf(y, t, count);
  const loglik = model.loglik + jacobian;
  const k = model.k + (lambdaEstimated && t.kind !== "none" ? 1 : 0);
  return { loglik, aicc: aiccOf(loglik, k, count), k, jacobian };
}

/**
 * The transformed series, or null where the transform fails (overflow, outside its domain) or leaves a constant.
 * @example transformSeries([1, Math.E], makeTransform("box-cox", 0)) // [0, 1]
 */
export function transformSeries(y: readonly number[], t: TransformSpec): number[] | null {
  const w = y.map((v) => transformForward(t, v));
  let first: number | null = null;
  let varies = false;
  for (let i = 0; i < w.length; i++) {
    const v = w[i];
    if (Number.isNaN(y[i])) continue; // a missing observation stays missing
    if (!Number.isFinite(v)) return null;
    if (first === null) first = v;
    else if (v !== first) varies = true;
  }
  return varies ? w : null;
}

/** Screening fits for comparing λ values (ets.ts `quick`); the model a rule keeps is refitted in full. */
const SCREENING = { quick: true } as const;

function fitConcrete(w: readonly number[], method: Exclude<MethodName, "auto">, period: number, quick = false): FittedModel {
  if (isArimaMethod(method)) {
    const spec = parseArimaMethod(method, period);
    return spec.auto ? autoArima(w, period).model : fitArima(w, spec.order);
  }
  return isBenchmark(method) ? fitBenchmark(w, method, period) : fitSmoothing(w, method as SmoothingMethod, period, quick ? SCREENING : {});
}

/**
 * One value of a form's profile likelihood in λ: the original-scale log-likelihood of a screening fit
 * at λ, or −∞ where the transform or the fit fails (METHODS §7).
 */
function profileLoglik(y: readonly number[], form: Exclude<MethodName, "auto">, period: number, kind: Exclude<TransformKind, "none">, shift: number, lambda: number): number {
  const t = makeTransform(kind, lambda, shift);
  const w = transformSeries(y, t);
  if (!w) return -Infinity;
  try {
    return originalScaleFit(fitConcrete(w, form, period, true), y, t, true).loglik;
  } catch (e) {
    if (e instanceof EngineError) return -Infinity;
    throw e;
  }
}

/** One (λ, form) pair tried by the `auto` rule. */
export interface LambdaCandidate { lambda: number; method: Exclude<MethodName, "auto">; aicc: number; loglik: number }

/** The outcome of {@link chooseLambdaAuto}. */
export interface LambdaAuto {
  lambda: number;
  transform: TransformSpec;
  model: FittedModel;
  /** For method `auto`: the forms compared at the chosen λ. */
  auto: AutoChoice | null;
  fit: OriginalScaleFit;
  /** Every (λ, form) pair, best first. */
  candidates: LambdaCandidate[];
  /** Original-scale AICc of the runner-up λ minus the winner's. */
  margin: number;
  /** True when no readable λ was supported by the chosen form's likelihood, so its own maximum was used. */
  usedMaximum: boolean;
  note: string;
}

/** Options of the λ rules. */
export interface ModelLambdaOptions {
  kind?: Exclude<TransformKind, "none">;
  shift?: number;
  /** Forecasting method (default `auto`). */
  method?: MethodName;
  period?: number;
  /** Level of the likelihood-ratio interval/test, a fraction (default 0.95). */
  level?: number;
  label?: string;
}

/**
 * The `auto` λ rule (on the latest LAMBDA_CHOICE_MAX values at most): every readable λ (1, ½, ⅓, 0, −½, −1) with every smoothing form that fits (or
 * with the given method), compared by AICc on the original scale (METHODS §7), lowest wins. The
 * winner is then held to the chosen form's own likelihood: if the likelihood-ratio test at `level`
 * rejects it against the profile maximum (Box & Cox 1964), the maximum itself is used and said.
 * @example chooseLambdaAuto(air, { period: 12 }).lambda // 0 (with holt-winters)
 */
export function chooseLambdaAuto(yAll: readonly number[], options: ModelLambdaOptions = {}): LambdaAuto {
  const y = recent(yAll);
  const kind = options.kind ?? "box-cox";
  const shift = options.shift ?? 0;
  const method = options.method ?? "auto";
  const period = options.period ?? 1;
  const level = options.level ?? 0.95;
  const label = options.label ?? "the series";
  if (kind === "box-cox") requirePositiveSeries(y.filter((v) => !Number.isNaN(v)).map((v) => v + shift), 1, label, "a Box-Cox forecast");
  if (y.length < 4) throw new EngineError("input", `${label} is too short to choose λ (${y.length} value${y.length === 1 ? "" : "s"}; at least 4). Give λ as a number (0 for the log) or "none".`);
  type Entry = { lambda: number; t: TransformSpec; model: FittedModel; auto: AutoChoice | null; fit: OriginalScaleFit };
  let best: Entry | null = null;
  const candidates: LambdaCandidate[] = [];
  const perLambda: { lambda: number; aicc: number }[] = [];
  let firstError: unknown = null;
  for (const lambda of READABLE_LAMBDAS) {
    const t = makeTransform(kind, lambda, shift);
    const w = transformSeries(y, t);
    if (!w) continue;
    try {
      let model: FittedModel;
      let auto: AutoChoice | null = null;
      if (method === "auto") {
        auto = fitAuto(w, period, SCREENING);
        model = auto.model;
        // Every smoothing form's likelihood covers all n points, so one Jacobian serves them all.
        const J = jacobianOf(y, t, w.length);
        for (const c of auto.candidates) {
          const ll = c.loglik + J;
          candidates.push({ lambda, method: c.method, aicc: aiccOf(ll, c.k + 1, w.length), loglik: ll });
        }
      } else {
        model = fitConcrete(w, method, period, true);
      }
      const fit = originalScaleFit(model, y, t, true);
      if (method !== "auto") candidates.push({ lambda, method: model.method, aicc: fit.aicc, loglik: fit.loglik });
      perLambda.push({ lambda, aicc: fit.aicc });
      if (!best || fit.aicc < best.fit.aicc) best = { lambda, t, model, auto, fit };
    } catch (e) {
      if (!(e instanceof EngineError)) throw e;
      if (firstError === null) firstError = e;
    }
  }
  if (!best) {
    if (firstError) throw firstError;
    throw new EngineError("input", `No readable λ (1, ½, ⅓, 0, −½, −1) gives ${label} a usable transformed series (each overflows or leaves it constant). Give λ as a number.`);
  }
  candidates.sort((a, b) => a.aicc - b.aicc);
  const sorted = perLambda.map((p) => p.aicc).sort((a, b) => a - b);
  const margin = sorted.length > 1 ? sorted[1] - sorted[0] : 0;
  const form = best.model.method;
  // Hold the winner to the chosen form's profile likelihood.
  const ll = (lambda: number): number => profileLoglik(y, form, period, kind, shift, lambda);
  const pts = READABLE_LAMBDAS.slice().sort((a, b) => a - b);
  const vals = pts.map((l) => {
    const c = candidates.find((cc) => cc.lambda === l && cc.method === form);
    return c ? c.loglik : ll(l);
  });
  let top = 0;
  for (let i = 1; i < pts.length; i++) if (vals[i] > vals[top]) top = i;
  const lo = top === 0 ? pts[0] - 1 : pts[top - 1];
  const hi = top === pts.length - 1 ? pts[pts.length - 1] + 1 : pts[top + 1];
  const cut = 0.5 * chiSquareQuantile(level, 1);
  let llMax = vals[top];
  let lamMax = pts[top];
  // A parabola through the best readable point and its neighbours estimates the profile's peak;
  // only when that could come near the cut is the peak searched for (each step is a full fit).
  const interior = top > 0 && top < pts.length - 1;
  let needSearch = true;
  if (interior) {
    const [x0, x1, x2] = [pts[top - 1], pts[top], pts[top + 1]];
    const [f0, f1, f2] = [vals[top - 1], vals[top], vals[top + 1]];
    const d = (x1 - x0) * (f1 - f2) - (x1 - x2) * (f1 - f0);
    if (Number.isFinite(f0) && Number.isFinite(f2) && d !== 0) {
      const xv = x1 - 0.5 * ((x1 - x0) ** 2 * (f1 - f2) - (x1 - x2) ** 2 * (f1 - f0)) / d;
      const a = ((f2 - f1) / (x2 - x1) - (f1 - f0) / (x1 - x0)) / (x2 - x0);
      const fv = f1 + (xv - x1) * ((f1 - f0) / (x1 - x0)) + a * (xv - x1) * (xv - x0);
      if (a < 0 && Number.isFinite(fv) && Math.max(fv, f1) - best.fit.loglik < 0.25 * cut) needSearch = false;
    }
  }
  if (needSearch) {
    const opt = minimizeBounded((l) => -ll(l), lo, hi, 1e-3);
    if (-opt.fx > llMax) {
      llMax = -opt.fx;
      lamMax = opt.x;
    }
  }
  const how = method === "auto" ? `λ and the form (${form}) chosen together` : `λ chosen for ${form}`;
  if (llMax - best.fit.loglik <= cut) {
    // the kept (λ, form) refitted in full (the comparison used screening fits)
    const wBest = transformSeries(y, best.t) as number[];
    const full = fitConcrete(wBest, form, period);
    const fullFit = originalScaleFit(full, y, best.t, true);
    const entry = candidates.find((c) => c.lambda === best.lambda && c.method === form);
    if (entry && fullFit.aicc < entry.aicc) {
      entry.aicc = fullFit.aicc;
      entry.loglik = fullFit.loglik;
      candidates.sort((a, b) => a.aicc - b.aicc);
    }
    const keep = fullFit.loglik >= best.fit.loglik ? { model: full, fit: fullFit } : { model: best.model, fit: best.fit };
    return {
      lambda: best.lambda, transform: best.t, model: keep.model, auto: best.auto ? { ...best.auto, model: keep.model } : null, fit: keep.fit, candidates, margin, usedMaximum: false,
      note: `auto: ${how} by AICc on the original scale among λ = 1, ½, ⅓, 0, −½, −1${perLambda.length > 1 ? ` (${margin.toFixed(1)} below the next λ)` : ""}.${sampleNote(yAll.length)}`,
    };
  }
  // No readable λ is supported: use the form's own maximum-likelihood λ.
  const t = makeTransform(kind, lamMax, shift);
  const w = transformSeries(y, t) as number[];
  const model = fitConcrete(w, form, period);
  const fit = originalScaleFit(model, y, t, true);
  const edge = lamMax <= lo + 1e-3 || lamMax >= hi - 1e-3 ? ` It lies at the end of the search (${fmt(lo)} to ${fmt(hi)}); give λ = "model" to search wider.` : "";
  return {
    lambda: lamMax, transform: t, model, auto: method === "auto" ? { ...(best.auto as AutoChoice), model } : null, fit, candidates, margin, usedMaximum: true,
    note: `auto: the likelihood of ${form} rejects every readable λ (best ${fmt(best.lambda)}), so its own maximum λ = ${fmt(lamMax)} is used.${edge}${sampleNote(yAll.length)}`,
  };
}

/** The outcome of {@link profileModelLambda}. */
export interface ModelLambda {
  lambda: number;
  loglik: number;
  interval: [number | null, number | null];
  level: number;
  bounds: [number, number];
  /** The bound λ̂ still sits on after widening to [−5, 5], or null. */
  onBound: "lower" | "upper" | null;
  method: Exclude<MethodName, "auto">;
  note: string;
}

/**
 * The `model` λ: the λ that maximises the given forecasting model's own likelihood on the original
 * scale, ℓ(λ) = ℓ_w(λ) + Σ ln|g′_λ(y_t)|, with the likelihood-ratio interval
 * {λ : ℓ(λ) ≥ ℓ(λ̂) − ½χ²₁(level)} measured from the true maximum (Box & Cox 1964's argument applied
 * to the time-series model; METHODS §7). The search starts on [lower, upper] (default [−1, 2]) and
 * widens to [−5, 5] when λ̂ lands on a bound; an interval end that does not exist within [−5, 5] is
 * reported open (null).
 * @example profileModelLambda(air, "holt-winters", { period: 12 }).interval // contains λ̂
 */
export function profileModelLambda(yAll: readonly number[], method: Exclude<MethodName, "auto">, options: ModelLambdaOptions & { lower?: number; upper?: number; known?: readonly LambdaCandidate[] } = {}): ModelLambda {
  const y = recent(yAll);
  const kind = options.kind ?? "box-cox";
  const shift = options.shift ?? 0;
  const period = options.period ?? 1;
  const level = options.level ?? 0.95;
  // Each value of the profile is a model fit: remember them (and take the ones the auto rule already made).
  const seen = new Map<number, number>();
  for (const c of options.known ?? []) if (c.method === method) seen.set(c.lambda, c.loglik);
  const ll = (lambda: number): number => {
    const hit = seen.get(lambda);
    if (hit !== undefined) return hit;
    const v = llFit(lambda);
    seen.set(lambda, v);
    return v;
  };
  const llFit = (lambda: number): number => profileLoglik(y, method, period, kind, shift, lambda);
  let bounds: [number, number] = [options.lower ?? -1, options.upper ?? 2];
  const search = (b: [number, number]): { x: number; f: number } => {
    const n = 13;
    let bi = 0;
    let bf = -Infinity;
    const xs: number[] = [];
    for (let i = 0; i < n; i++) {
      const x = b[0] + ((b[1] - b[0]) * i) / (n - 1);
      xs.push(x);
      const f = ll(x);
      if (f > bf) { bf = f; bi = i; }
    }
    if (!Number.isFinite(bf)) throw new EngineError("input", `No λ between ${fmt(b[0])} and ${fmt(b[1])} gives a usable fit of ${method}.`);
    const r = minimizeBounded((l) => -ll(l), xs[Math.max(0, bi - 1)], xs[Math.min(n - 1, bi + 1)], 1e-4);
    return -r.fx >= bf ? { x: r.x, f: -r.fx } : { x: xs[bi], f: bf };
  };
  let best = search(bounds);
  let hit = boundHit(best.x, bounds);
  if (hit && (bounds[0] > -5 || bounds[1] < 5)) {
    bounds = [-5, 5];
    best = search(bounds);
    hit = boundHit(best.x, bounds);
  }
  const cut = best.f - 0.5 * chiSquareQuantile(level, 1);
  const g = (l: number): number => ll(l) - cut;
  const end = (dir: -1 | 1): number | null => {
    let inner = best.x;
    for (let step = 0.1; ; step *= 2) {
      const outer = Math.max(-5, Math.min(5, inner + dir * step));
      if (g(outer) < 0) {
        const r = findRoot(g, inner, outer, 1e-5);
        return Number.isFinite(r) ? r : null;
      }
      if (outer === -5 || outer === 5) return null;
      inner = outer;
    }
  };
  const interval: [number | null, number | null] = [end(-1), end(1)];
  const notes: string[] = [];
  if (hit) notes.push(`λ̂ sits on the ${hit} end of the widest search (${fmt(bounds[hit === "lower" ? 0 : 1])}); the likelihood may keep rising beyond it.`);
  if (interval[0] === null || interval[1] === null) notes.push(`The ${Math.round(level * 100)}% interval is open at the ${interval[0] === null ? "low" : "high"} end: the likelihood does not fall far enough within λ = ${interval[0] === null ? -5 : 5}.`);
  return { lambda: best.x, loglik: best.f, interval, level, bounds, onBound: hit, method, note: (notes.join(" ") + sampleNote(yAll.length)).trim() };
}

/**
 * λ as every face suggests it: `auto` (the λ {@link chooseLambdaAuto} picks, which is the λ a
 * forecast with lambda "auto" then uses) or `model` (the chosen form's own maximum), each with the
 * likelihood-ratio interval of the chosen form's profile likelihood on the original scale
 * (METHODS §7) — so the interval shown always belongs to the likelihood that chose the λ.
 * @example fitLambdaForModel(air, { period: 12 }).lambda // 0
 */
export function fitLambdaForModel(y: readonly number[], options: ModelLambdaOptions & { lambdaMethod?: "auto" | "model" } = {}): LambdaChoice {
  const a = chooseLambdaAuto(y, options);
  // the auto rule's screening fits at the readable λ are the same profile's values (same data, same fits)
  const p = profileModelLambda(y, a.model.method, { ...options, known: recent(y).length === y.length ? a.candidates : undefined });
  const notes = [a.note];
  if (options.lambdaMethod === "model") {
    if (p.note) notes.push(p.note);
    return { lambda: p.lambda, method: "model", interval: p.interval, level: p.level, readable: p.lambda, loglik: p.loglik, bounds: p.bounds, onBound: p.onBound, window: null, skippedWindows: 0, n: y.filter((v) => !Number.isNaN(v)).length, missing: y.filter((v) => Number.isNaN(v)).length, note: `λ maximises the likelihood of ${a.model.method} on the original scale. ${notes.slice(1).join(" ")}`.trim() };
  }
  const [lo, hi] = p.interval;
  if ((lo !== null && a.lambda < lo - 1e-6) || (hi !== null && a.lambda > hi + 1e-6)) {
    notes.push(`The profile likelihood of ${a.model.method} peaks at λ = ${fmt(p.lambda)}, and its interval leaves λ = ${fmt(a.lambda)} out; give lambda "model" to use the peak.`);
  }
  if (p.onBound) notes.push(p.note);
  return { lambda: a.lambda, method: "auto", interval: p.interval, level: p.level, readable: a.lambda, loglik: a.fit.loglik, bounds: p.bounds, onBound: null, window: null, skippedWindows: 0, n: y.filter((v) => !Number.isNaN(v)).length, missing: y.filter((v) => Number.isNaN(v)).length, note: notes.join(" ") };
}
