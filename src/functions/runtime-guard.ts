// Outside Excel (the stand-alone pane in a plain browser) the platform's CustomFunctions object
// does not exist, but the build appends CustomFunctions.associate(...) calls to this bundle.
// Give them a no-op so the page loads cleanly; inside Excel the real object is already there.
const g = globalThis as unknown as { CustomFunctions?: unknown };
if (typeof g.CustomFunctions === "undefined") {
  class FallbackError extends Error {
    constructor(public code: string, message?: string) {
      super(message);
    }
  }
  g.CustomFunctions = {
    associate: (): void => undefined,
    Error: FallbackError,
    ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A", invalidNumber: "#NUM!", divisionByZero: "#DIV/0!", nullReference: "#NULL!", invalidName: "#NAME?", invalidReference: "#REF!" },
  };
}
export {};
