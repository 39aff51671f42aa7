/**
 * Larmoir glass model: pure functions, no framework imports.
 * Start with computeFilm, computeCurve, describePour and the standard-drink helpers.
 */
export * from './constants'
export * from './ranges'
export * from './composition'
export * from './surfaceTension'
export * from './vle'
export * from './film'
export * from './activityIndex'
export * from './air'
export * from './climbingFilm'
export * from './uncertainty'
export * from './viscosity'
export * from './predictions'
export * from './standardDrinks'
export * from './glassModel'
