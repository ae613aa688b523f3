// Minimal typings for the parts of jStat that Cellwright uses.
declare module 'jstat' {
  interface Distribution {
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  export const jStat: {
    studentt: Distribution;
    centralF: Distribution;
    normal: Distribution;
    chisquare: Distribution;
  };
}
