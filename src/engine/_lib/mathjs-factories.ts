// mathjs ships its factory functions (createMultiply, …) from its main entry but its type
// declarations do not list them; this declares the few the engine builds its matrix product from.
// (A type declaration only: nothing runs here.)
import type { FactoryFunction } from "mathjs";

type Factory = FactoryFunction<unknown>;

declare module "mathjs" {
  export const createTyped: Factory;
  export const createMatrixClass: Factory;
  export const createDenseMatrixClass: Factory;
  export const createSparseMatrixClass: Factory;
  export const createMatrix: Factory;
  export const createEqualScalar: Factory;
  export const createAddScalar: Factory;
  export const createMultiplyScalar: Factory;
  export const createConj: Factory;
  export const createSize: Factory;
  export const createDot: Factory;
  export const createMultiply: Factory;
}
