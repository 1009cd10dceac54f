// jstat ships no type declarations; the tests use it only as an outside cross-check.
declare module "jstat" {
  const jStat: any;
  export default jStat;
}
