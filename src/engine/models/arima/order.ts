// The project's own syntax for ARIMA methods: `arima` (automatic order search) or an explicit
// order `arima:p,d,q` (non-seasonal) and `arima:p,d,q/P,D,Q` (with a seasonal part whose period
// is the series' period), with an optional `+c` for a constant (a drift once differenced), e.g.
// `arima:0,1,1/0,1,1` or `arima:1,1,0+c`. Model: Box & Jenkins' seasonal ARIMA
// φ(B)Φ(B^m)(1 − B)^d(1 − B^m)^D w_t = c + θ(B)Θ(B^m)ε_t.
import { EngineError } from "../../errors";

/** A seasonal ARIMA order; `m` is the seasonal period (1 when there is no seasonal part). */
export interface ArimaOrder {
  p: number; d: number; q: number;
  P: number; D: number; Q: number;
  m: number;
  /** A constant on the differenced scale (the mean when d + D = 0, the drift when d + D = 1). */
  constant: boolean;
}

/** Largest orders accepted (larger orders say more about noise than about the series). */
export const ARIMA_LIMITS = { p: 5, d: 2, q: 5, P: 2, D: 1, Q: 2 } as const;

/**
 * Formats an order in the project's syntax.
 * @example formatArimaOrder({ p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false }) // "arima:0,1,1/0,1,1"
 */
export function formatArimaOrder(o: ArimaOrder): string {
  const seasonal = o.P + o.D + o.Q > 0 ? `/${o.P},${o.D},${o.Q}` : "";
  return `arima:${o.p},${o.d},${o.q}${seasonal}${o.constant ? "+c" : ""}`;
}

/**
 * A readable title such as "ARIMA(0,1,1)(0,1,1)[12]".
 * @example arimaTitle({ p: 1, d: 1, q: 0, P: 0, D: 0, Q: 0, m: 1, constant: true }) // "ARIMA(1,1,0) with drift"
 */
export function arimaTitle(o: ArimaOrder): string {
  const seasonal = o.P + o.D + o.Q > 0 ? `(${o.P},${o.D},${o.Q})[${o.m}]` : "";
  const k = o.d + o.D;
  const c = o.constant ? (k === 0 ? " with mean" : k === 1 ? " with drift" : " with constant") : "";
  return `ARIMA(${o.p},${o.d},${o.q})${seasonal}${c}`;
}

/** The result of reading a method name: `auto` search or a given order. */
export type ArimaSpec = { auto: true } | { auto: false; order: ArimaOrder };

/**
 * True when a method name is one of the ARIMA methods (`arima`, `arima:…`), case-insensitive.
 * @example isArimaMethod("ARIMA:0,1,1") // true
 */
export function isArimaMethod(name: unknown): boolean {
  return typeof name === "string" && /^\s*arima(\s*:.*)?\s*$/i.test(name);
}

function orderPart(text: string, what: string, original: string): [number, number, number] {
  const parts = text.split(",").map((s) => s.trim());
  if (parts.length !== 3 || parts.some((s) => s === "")) {
    throw new EngineError("input", `The ${what} order in "${original}" needs three whole numbers p,d,q, e.g. "arima:0,1,1" or "arima:0,1,1/0,1,1".`);
  }
  const nums = parts.map((s) => (/^\d+$/.test(s) ? Number(s) : NaN));
  parts.forEach((s, i) => {
    if (!Number.isInteger(nums[i])) {
      throw new EngineError("input", `The ${what} order in "${original}" has "${s}" where a whole number ≥ 0 is needed (orders count lags: 0, 1, 2…).`);
    }
  });
  return nums as [number, number, number];
}

/**
 * Reads `arima`, `arima:p,d,q`, `arima:p,d,q/P,D,Q` (optionally ending in `+c` for a constant).
 * A seasonal part needs a period of at least 2. Orders above ARIMA_LIMITS are refused.
 * Without `+c`/`-c` a constant (the mean) is used when d + D = 0 and none otherwise; `+c` with
 * d + D = 1 adds a drift (`arima:0,1,0+c` is the random walk with drift).
 * @example parseArimaMethod("arima:0,1,1/0,1,1", 12) // { auto: false, order: { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, m: 12, constant: false } }
 */
export function parseArimaMethod(name: string, period: number): ArimaSpec {
  const original = name;
  const text = name.trim().toLowerCase();
  if (text === "arima") return { auto: true };
  const m = /^arima\s*:(.*)$/.exec(text);
  if (!m) throw new EngineError("input", `Unknown method "${original}". ARIMA methods are written "arima", "arima:p,d,q" or "arima:p,d,q/P,D,Q".`);
  let body = m[1].trim();
  let constant: boolean | null = null;
  const cm = /^(.*?)\s*([+-])\s*c$/.exec(body);
  if (cm) {
    body = cm[1];
    constant = cm[2] === "+";
  }
  const halves = body.split("/");
  if (halves.length > 2) throw new EngineError("input", `"${original}" has more than one "/": write "arima:p,d,q/P,D,Q".`);
  const [p, d, q] = orderPart(halves[0], "non-seasonal", original);
  const [P, D, Q] = halves.length === 2 ? orderPart(halves[1], "seasonal", original) : [0, 0, 0];
  const seasonal = P + D + Q > 0;
  if (seasonal && !(period >= 2)) {
    throw new EngineError("input", `"${original}" has a seasonal part: give the period (12 for monthly data, 4 for quarterly).`);
  }
  const limits: Array<[string, number, number]> = [["p", p, ARIMA_LIMITS.p], ["d", d, ARIMA_LIMITS.d], ["q", q, ARIMA_LIMITS.q], ["P", P, ARIMA_LIMITS.P], ["D", D, ARIMA_LIMITS.D], ["Q", Q, ARIMA_LIMITS.Q]];
  for (const [label, v, max] of limits) {
    if (v > max) throw new EngineError("input", `"${original}": ${label} = ${v} is more than Fanwise fits (at most ${max}). Use a smaller order.`);
  }
  const k = d + D;
  if (constant === true && k > 1) {
    throw new EngineError("input", `"${original}": a constant after ${k} differences would be a quadratic trend; use +c only with d + D ≤ 1.`);
  }
  return { auto: false, order: { p, d, q, P, D, Q, m: seasonal ? period : 1, constant: constant ?? k === 0 } };
}
