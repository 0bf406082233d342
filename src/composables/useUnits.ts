import { computed } from 'vue'
import { useSessionStore } from '@/stores/session'
import * as u from '@shared/units/convert'

export type Quantity = 'thickness' | 'temperature' | 'temperatureDelta' | 'area'

/**
 * The signed-in person's display units. Values in and out of the API stay µm / °C / m²;
 * `fromStored` / `toStored` convert at the form field, `format*` at the label.
 */
export function useUnits() {
  const session = useSessionStore()
  const units = computed(() => session.units)

  function unitLabel(q: Quantity): string {
    if (q === 'thickness') return u.THICKNESS_UNIT_LABELS[units.value.thickness]
    if (q === 'area') return u.AREA_UNIT_LABELS[units.value.area]
    return u.TEMPERATURE_UNIT_LABELS[units.value.temperature]
  }

  function fromStored(q: Quantity, value: number): number {
    if (q === 'thickness') return u.thicknessFromUm(value, units.value.thickness)
    if (q === 'temperature') return u.temperatureFromC(value, units.value.temperature)
    if (q === 'temperatureDelta') return u.temperatureDeltaFromC(value, units.value.temperature)
    return u.areaFromM2(value, units.value.area)
  }

  function toStored(q: Quantity, value: number): number {
    if (q === 'thickness') return u.thicknessToUm(value, units.value.thickness)
    if (q === 'temperature') return u.temperatureToC(value, units.value.temperature)
    if (q === 'temperatureDelta') return u.temperatureDeltaToC(value, units.value.temperature)
    return u.areaToM2(value, units.value.area)
  }

  return {
    units,
    unitLabel,
    fromStored,
    toStored,
    thickness: (um: number | null | undefined) => u.formatThickness(um, units.value.thickness),
    band: (minUm: number, maxUm: number | null) =>
      u.formatThicknessBand(minUm, maxUm, units.value.thickness),
    temperature: (c: number | null | undefined) => u.formatTemperature(c, units.value.temperature),
    temperatureDelta: (c: number) => u.formatTemperatureDelta(c, units.value.temperature),
    area: (m2: number | null | undefined) => u.formatArea(m2, units.value.area),
  }
}
