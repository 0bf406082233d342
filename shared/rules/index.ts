/**
 * Filmtrail inspection rules: pure functions, µm and °C inside. Shared by the server (which
 * stores the inputs and verdicts) and the tablet (which shows them as the inspector works).
 * Each module's header names the standard and clause it follows and which values are settings.
 */
export * from './errors'
export * from './units'
export * from './format'
export * from './climate'
export * from './surfacePrep'
export * from './pa2'
export * from './iso19840'
export * from './sampling'
export * from './holiday'
export * from './cure'
export * from './adhesion'
export * from './statistics'
export * from './westernElectric'
export * from './verdict'
export * from './partInput'
export * from './evaluatePart'
export * from './evaluateLot'
