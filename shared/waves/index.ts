// Wave preview: hard-wall corral, 1-D box for chains and s-wave multiple scattering, with the
// Bessel/Hankel functions and surface-state presets they rest on.
export { besselJ, besselY, besselJPair, besselJY01, hankel1Zero } from './bessel'
export { besselJZero, besselJZeros } from './bessel-zeros'
export { hankel1ZeroComplex } from './hankel-complex'
export { HBAR_eVs, ELECTRON_MASS_kg, ELEMENTARY_CHARGE_C, HBAR2_2ME_eVnm2, kineticPrefactor_eVnm2, cleanDos2D_per_eVnm2 } from './constants'
export { corralLevels, corralModes, corralLdos, corralSpectrum, corralMap, modeDensity, lorentzian } from './corral'
export type { CorralLevel, CorralMode } from './corral'
export { computeCorral, tailMargin_eV, DEFAULT_MAP_BROADENING_eV, MAX_SUMMED_LEVELS } from './compute-corral'
export type { CorralOutput } from './compute-corral'
export { boxLength, boxLevels, boxDensity, boxLdosLine, boxSpectrum, atomPosition_nm } from './box'
export type { BoxGeometry, BoxLengthConvention, BoxLevel } from './box'
export { computeBox } from './compute-box'
export type { BoxOutput } from './compute-box'
export {
  amplitudeFromPhaseShift, BLACK_DOT, waveNumber, cleanLdosRatio, ScatteringAtEnergy, scatteringMap,
  scatteringSpectrum, scatteringMatrix, MIN_DISTANCE_nm,
} from './scattering'
export type { Complex } from './scattering'
export { computeScattering, MIN_SCATTERER_SEPARATION_nm } from './compute-scattering'
export type { ScatteringOutput } from './compute-scattering'
export { luFactor, luSolve, luInverse } from './complex-lu'
export { SURFACE_STATE_PRESETS, PRESET_IDS, findPreset, sensibleBiasRange } from './presets'
export type { SurfaceStatePreset } from './presets'
export { CorralInput, BoxInput, ScatteringInput, WAVE_LIMITS } from './schema'
