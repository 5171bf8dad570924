// Types for the dev dependency used by the tests as an independent integrator.
declare module "integrate-adaptive-simpson" {
  export default function integrate(f: (x: number) => number, a: number, b: number, tol?: number, maxdepth?: number): number;
}
