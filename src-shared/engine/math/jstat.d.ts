// Minimal types for the parts of jstat the engine uses. jstat is a CommonJS
// module whose module.exports is the jStat object: under Node's ESM loader
// only the default import works (a named `{ jStat }` import fails there).
declare module 'jstat' {
  interface JStat {
    normal: { cdf(x: number, mean: number, sd: number): number; inv(p: number, mean: number, sd: number): number };
    chisquare: { cdf(x: number, df: number): number };
    jStat: JStat;
  }
  const jStat: JStat;
  export { jStat };
  export default jStat;
}
