import type { InjectionKey, Ref } from 'vue'
import { DEFAULT_FLOAT_LIMIT } from '#shared/engine'

/** How the motif is checked and previewed: kept on the device, the same for every motif. */
export interface MotifCheckSettings {
  /** Floats longer than this many stitches are marked and caught. */
  limit: number
  /** Needle pitch in mm: a float's length in mm is its stitches times this (about; a swatch says exactly). */
  pitchMm: number
  needlesInWork: number
  /** Centred on the needles in work, or the leftmost needle knits chart stitch `offset + 1`. */
  centred: boolean
  offset: number
  stitchesPer10cm: number
  rowsPer10cm: number
  mainHex: string
  contrastHex: string
  heatMap: boolean
}

export const MAX_NEEDLES_IN_WORK = 200

export const defaultMotifCheckSettings: MotifCheckSettings = {
  limit: DEFAULT_FLOAT_LIMIT,
  pitchMm: 4.5,
  needlesInWork: 60,
  centred: true,
  offset: 0,
  stitchesPer10cm: 30,
  rowsPer10cm: 40,
  mainHex: '#efe6d2',
  contrastHex: '#1f4e5f',
  heatMap: true,
}

const key: InjectionKey<Ref<MotifCheckSettings>> = Symbol('motif-check-settings')

/** Called once by the motif page; its panels share the same settings through inject. */
export function provideMotifCheckSettings(): Ref<MotifCheckSettings> {
  const settings = useLocalStorage<MotifCheckSettings>('fw-motif-check', { ...defaultMotifCheckSettings }, { mergeDefaults: true })
  provide(key, settings)
  return settings
}

export function useMotifCheckSettings(): Ref<MotifCheckSettings> {
  const settings = inject(key)
  if (!settings) throw new Error('useMotifCheckSettings: call provideMotifCheckSettings() in the page first')
  return settings
}

/** A whole number within bounds, or the fallback when the field is empty or not a number. */
export function clampWhole(value: unknown, min: number, max: number, fallback: number): number {
  const n = Math.round(Number(value))
  return Number.isFinite(n) && value !== '' ? Math.min(max, Math.max(min, n)) : fallback
}
