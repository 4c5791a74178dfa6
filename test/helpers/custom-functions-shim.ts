// Outside Excel, office.js does not define CustomFunctions.Error (PLATFORM.md); tests install this
// small stand-in with the same shape (code, message) and the same ErrorCode strings.
export class ShimError extends Error {
  constructor(public code: string, message?: string) {
    super(message ?? "");
  }
}

const g = globalThis as unknown as { CustomFunctions: unknown };
g.CustomFunctions = {
  Error: ShimError,
  ErrorCode: {
    invalidValue: "#VALUE!", notAvailable: "#N/A", invalidNumber: "#NUM!", divisionByZero: "#DIV/0!",
    nullReference: "#NULL!", invalidName: "#NAME?", invalidReference: "#REF!",
  },
  associate: (): void => undefined,
};

/** True when v is a cell error with the given code (and, optionally, a message matching). */
export function isCellError(v: unknown, code?: string, message?: RegExp): boolean {
  if (!(v instanceof ShimError)) return false;
  if (code && v.code !== code) return false;
  if (message && !message.test(v.message)) return false;
  return true;
}
