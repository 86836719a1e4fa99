// Pullsheet's dyno computation library: pure TypeScript, no I/O, shared by the
// server (import checks, published figures) and the browser (previews, graphs).
// Sources of every formula: shared/dyno/README.md.

export type * from './types'
export * from './units'
export * from './vapor'
export * from './correction'
export * from './csv'
export * from './problems'
export * from './csv-write'
export * from './resample'
export * from './band'
export * from './compare'
export * from './repeat'
export * from './table'
export * from './engine'
export * from './cam'
export * from './round'
export * from './display'
export * from './synthetic'
export * from './analyse'
export * from './pull-format'
export * from './pull-sample'
