// Unit constants and conversions. Sources: NIST SP 811 (2008), Appendix B, and the
// exact definitions behind its entries (ft = 0.3048 m, lb = 0.45359237 kg,
// standard gravity 9.80665 m/s^2, conventional mercury density 13.5951 g/cm^3).

export const M_PER_FT = 0.3048
/** lbf = 0.45359237 kg x 9.80665 m/s^2 */
export const N_PER_LBF = 4.4482216152605
/** 1 lbf-ft in N-m (SP 811: 1.355818) */
export const NM_PER_LBFT = M_PER_FT * N_PER_LBF
/** mechanical horsepower, 550 ft-lbf/s (SP 811: 7.456999 E+02 W) */
export const W_PER_HP = 550 * NM_PER_LBFT
/** metric horsepower (PS), 75 kgf-m/s (SP 811: 7.354988 E+02 W) */
export const W_PER_PS = 75 * 9.80665
/** conventional inch of mercury, 0 deg C (SP 811: 3.386389 E+03 Pa) */
export const KPA_PER_INHG = 3.386388640341
/** hp = lb-ft x rpm / HP_TORQUE_RPM, i.e. 33000 / (2 pi) = 5252.113... */
export const HP_TORQUE_RPM = 33000 / (2 * Math.PI)
/** kW = N-m x rpm / KW_TORQUE_RPM, i.e. 60000 / (2 pi) = 9549.296... */
export const KW_TORQUE_RPM = 60000 / (2 * Math.PI)
export const KELVIN_AT_0C = 273.15
export const RANKINE_AT_0F = 459.67

/** Power in hp from torque in lb-ft at an engine speed. */
export function powerHp(torqueLbFt: number, rpm: number): number {
  return (torqueLbFt * rpm) / HP_TORQUE_RPM
}

/** Torque in lb-ft from power in hp; undefined at 0 rpm, so it throws there. */
export function torqueLbFt(powerHp: number, rpm: number): number {
  if (!(rpm > 0)) throw new RangeError(`torque from power needs an engine speed above 0 rpm (got ${rpm})`)
  return (powerHp * HP_TORQUE_RPM) / rpm
}

export const lbFtToNm = (torqueLbFt: number): number => torqueLbFt * NM_PER_LBFT
export const nmToLbFt = (torqueNm: number): number => torqueNm / NM_PER_LBFT

export const hpToKw = (powerHp: number): number => (powerHp * W_PER_HP) / 1000
export const kwToHp = (powerKw: number): number => (powerKw * 1000) / W_PER_HP
export const hpToPs = (powerHp: number): number => (powerHp * W_PER_HP) / W_PER_PS
export const psToHp = (powerPs: number): number => (powerPs * W_PER_PS) / W_PER_HP
export const kwToPs = (powerKw: number): number => (powerKw * 1000) / W_PER_PS
export const psToKw = (powerPs: number): number => (powerPs * W_PER_PS) / 1000

export const inHgToKPa = (pressureInHg: number): number => pressureInHg * KPA_PER_INHG
export const kPaToInHg = (pressureKPa: number): number => pressureKPa / KPA_PER_INHG
export const inHgToMbar = (pressureInHg: number): number => pressureInHg * KPA_PER_INHG * 10
export const mbarToInHg = (pressureMbar: number): number => pressureMbar / 10 / KPA_PER_INHG

export const fToC = (tempF: number): number => ((tempF - 32) * 5) / 9
export const cToF = (tempC: number): number => (tempC * 9) / 5 + 32
export const fToK = (tempF: number): number => fToC(tempF) + KELVIN_AT_0C
export const cToK = (tempC: number): number => tempC + KELVIN_AT_0C
export const fToR = (tempF: number): number => tempF + RANKINE_AT_0F
