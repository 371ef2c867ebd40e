// The planning calculators: pure functions the phone runs offline and the server re-checks.
// Each validates its input and throws RangeError with a message a screen can show.
// `export *` (not named re-exports) so Nuxt's auto-import scan sees each name once, from the file
// that defines it, instead of warning about the same name from two files.
export * from './planning-steps'
export * from './planning-base'
export * from './planning-materials'
export * from './planning-units'
export * from './planning-measure'
export * from './planning-lifting'
export * from './planning-walls'
export * from './planning-pavers'
export * from './planning-excavation'
