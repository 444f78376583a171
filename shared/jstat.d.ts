// Minimal typings for jstat 1.9.6 (the package ships none); only what the screening engine uses.
declare module 'jstat' {
  interface JStatStudentT {
    inv(p: number, dof: number): number;
    cdf(x: number, dof: number): number;
  }
  const jstat: { jStat: { studentt: JStatStudentT } };
  export default jstat;
}
