// Minimal typings for the reference libraries used only in tests.
declare module 'jstat' {
  interface Distribution {
    inv(p: number, ...params: number[]): number;
    cdf(x: number, ...params: number[]): number;
  }
  const jStat: {
    chisquare: Distribution;
    gamma: Distribution;
    normal: Distribution;
    beta: Distribution;
    poisson: { cdf(k: number, lambda: number): number; pdf(k: number, lambda: number): number };
  };
  export default jStat;
}

declare module 'convert-units' {
  interface Converter {
    from(unit: string): { to(unit: string): number };
  }
  function convert(value: number): Converter;
  export default convert;
}
