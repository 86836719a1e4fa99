// Engine figures in the textbook forms (e.g. Heywood, Internal Combustion Engine
// Fundamentals, ch. 2), in the inch-pound units of the build sheet. Four-stroke only.

function positive(name: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) throw new RangeError(`${name} must be a number above 0 (got ${value})`)
}

/** Swept volume: pi / 4 x bore^2 x stroke x cylinders, cubic inches. */
export function displacementCi({ boreIn, strokeIn, cylinders }: { boreIn: number, strokeIn: number, cylinders: number }): number {
  positive('bore', boreIn)
  positive('stroke', strokeIn)
  if (!Number.isInteger(cylinders) || cylinders < 1) throw new RangeError(`cylinders must be a whole number from 1 (got ${cylinders})`)
  return (Math.PI / 4) * boreIn ** 2 * strokeIn * cylinders
}

export const ciToLiters = (displacementCi: number): number => (displacementCi * 2.54 ** 3) / 1000
export const litersToCi = (displacementL: number): number => (displacementL * 1000) / 2.54 ** 3

/** Brake mean effective pressure, 4-stroke: 4 pi T / Vd, with T in lb-in (x 12): about 150.8 x lb-ft / in^3. */
export function bmepPsi(torqueLbFt: number, displacementCi: number): number {
  positive('displacement', displacementCi)
  return (4 * Math.PI * torqueLbFt * 12) / displacementCi
}

/** Airflow of a 4-stroke at 100 % volumetric efficiency: in^3 x rpm / 2 / 1728 = in^3 x rpm / 3456. */
export function theoreticalCfm(displacementCi: number, rpm: number): number {
  return (displacementCi * rpm) / 3456
}

/** Measured airflow as a percentage of the theoretical airflow. */
export function volumetricEfficiencyPct(measuredCfm: number, displacementCi: number, rpm: number): number {
  const theory = theoreticalCfm(displacementCi, rpm)
  positive('theoretical airflow', theory)
  return (measuredCfm / theory) * 100
}

/** Mean piston speed: 2 strokes per revolution, inches to feet: stroke x rpm / 6. */
export function pistonSpeedFtMin(strokeIn: number, rpm: number): number {
  return (strokeIn * rpm) / 6
}

/** lb/hp-h in g/kWh: 453.59237 g / 0.74569987 kW = 608.28. */
export const G_PER_KWH_PER_LB_PER_HPH = 453.59237 / 0.7456998715822702

/** Brake specific fuel consumption: fuel mass flow / brake power, lb/hp-h. */
export function bsfcLbPerHpH(fuelLbPerH: number, powerHp: number): number {
  positive('power', powerHp)
  return fuelLbPerH / powerHp
}
