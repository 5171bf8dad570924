// The part of jstat's API that the engine uses (the package ships no types).
declare module "jstat" {
  interface JStat {
    chisquare: { cdf(x: number, dof: number): number };
  }
  const jStat: JStat;
  export default jStat;
}
