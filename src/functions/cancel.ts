// Cancelable long functions. Excel cancels a running call when one of its arguments changes or the
// user forces a recalculation, but tells only a function marked cancelable: its metadata says
// { "cancelable": true } (the JSDoc tag @cancelable) and Excel then passes a CancelableInvocation
// after the declared arguments, whose onCanceled handler it calls ("CustomFunctions.CancelableInvocation":
// https://learn.microsoft.com/javascript/api/custom-functions-runtime/customfunctions.cancelableinvocation;
// options.cancelable in "Manually create JSON metadata for custom functions":
// https://learn.microsoft.com/office/dev/add-ins/excel/custom-functions-json). The shared runtime
// is one thread for the cells and the pane, so a stale call that runs on is work stolen from the
// fresh one. A cancelled call stops at its next yield (between series, between backtest origins).
//
// Pattern (DEVELOPERS.md, "Long functions: cancelable"):
//   /** … @cancelable */
//   export async function TOTAL(values: any[][], …): Promise<any[][]> {
//     const cancel = cancelSignal(TOTAL, arguments);
//     return guardAsync(async () => { … await eachSeries(…, cancel) / withCancel(yieldToHost, cancel) … });
//   }
// `arguments` rather than a last `invocation` parameter keeps the signature free for new optional
// arguments appended after the existing ones.

/** Thrown at a yield point once Excel has cancelled the call; Excel discards the call's result. */
export class CallCancelled extends Error {
  constructor() {
    super("Excel cancelled this calculation (an argument changed or the sheet recalculated); the newer call gives the result.");
    this.name = "CallCancelled";
  }
}

/** Whether Excel has cancelled this call. */
export interface CancelSignal {
  readonly cancelled: boolean;
  /** Throws CallCancelled when the call has been cancelled. */
  throwIfCancelled(): void;
}

/** A signal that never fires (the function was called without an invocation, e.g. in tests). */
export const NEVER_CANCELLED: CancelSignal = { cancelled: false, throwIfCancelled: () => undefined };

/**
 * The cancel signal of a @cancelable custom function's current call: Excel passes the
 * CancelableInvocation after the declared parameters, so it is the last of `args` when there are more
 * arguments than `fn` declares. Without one (called from code or tests) the signal never fires.
 * @example cancelSignal(function f(a: unknown) { return a; }, [1]).cancelled // false
 */
// eslint-disable-next-line @typescript-eslint/no-unsafe-function-type
export function cancelSignal(fn: Function, args: ArrayLike<unknown>): CancelSignal {
  const last = args.length > fn.length ? args[args.length - 1] : undefined;
  if (last === null || typeof last !== "object" || Array.isArray(last)) return NEVER_CANCELLED;
  let cancelled = false;
  (last as CustomFunctions.CancelableInvocation).onCanceled = () => {
    cancelled = true;
  };
  return {
    get cancelled() {
      return cancelled;
    },
    throwIfCancelled() {
      if (cancelled) throw new CallCancelled();
    },
  };
}

let pauses = 0;

/**
 * `pause` (the runtime's yield), then stop if Excel cancelled the call meanwhile: the yield is where
 * Excel's cancel event can arrive, so checking right after it stops at the first chance.
 * @example await withCancel(() => Promise.resolve(), NEVER_CANCELLED)() // undefined
 */
export function withCancel(pause: () => Promise<void>, signal: CancelSignal): () => Promise<void> {
  return async () => {
    pauses++;
    await pause();
    signal.throwIfCancelled();
  };
}

/** How many cancellable pauses ran since the last reset (tests: a cancelled call stops at the next one). */
export function pauseCount(reset = false): number {
  const n = pauses;
  if (reset) pauses = 0;
  return n;
}
