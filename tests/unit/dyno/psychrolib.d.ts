// Minimal types for the parts of psychrolib (ASHRAE Handbook Fundamentals 2017 ch. 1) the tests use.
declare module 'psychrolib' {
  const psychrolib: {
    SI: number
    IP: number
    SetUnitSystem(system: number): void
    /** SI: deg C in, Pa out. */
    GetSatVapPres(tDryBulb: number): number
  }
  export default psychrolib
}
