import { describe, expect, it } from 'vitest'
import { checkMpptCurrent, checkMpptWindow, stringVmpAtCellTemperature, type ModuleVmpData, type MpptInput } from '../../shared/electrical/rules/mppt'

const module: ModuleVmpData = { vmpV: 31, pmaxW: 400, vmpCoefficient: null, pmaxCoefficient: { value: -0.35, unit: '%/°C' } }
const input: MpptInput = { mpptMinV: 100, mpptMaxV: 480, startVoltageV: 120, maxInputCurrentPerMpptA: 15, maxShortCircuitCurrentPerMpptA: 20 }

describe('hot-day and cold-day Vmp against the MPPT window', () => {
  // linear temperature model of IEC 60891 procedure 1: V(T) = V_STC × (1 + β (T − 25 °C))
  it('uses the Vmp coefficient when given', () => {
    const d = stringVmpAtCellTemperature('k', 'Vmp hot', { ...module, vmpCoefficient: { value: -0.3, unit: '%/°C' } }, 10, 65)
    // 10 × 31 × (1 − 0.003 × 40) = 272.8 V, worked by hand
    expect(d.value).toBeCloseTo(272.8, 6)
    expect(d.message).toContain('datasheet')
  })

  it('uses the Pmax coefficient in its place and says so', () => {
    const d = stringVmpAtCellTemperature('k', 'Vmp hot', module, 10, 61)
    // 10 × 31 × (1 − 0.0035 × 36) = 270.94 V
    expect(d.value).toBeCloseTo(270.94, 6)
    expect(d.message).toContain('Pmax coefficient')
  })

  it('converts a W/°C Pmax coefficient to %/°C', () => {
    // −1.4 W/°C on 400 W is −0.35 %/°C
    const w = stringVmpAtCellTemperature('k', '', { ...module, pmaxCoefficient: { value: -1.4, unit: 'W/°C' } }, 10, 61)
    expect(w.value).toBeCloseTo(270.94, 6)
  })

  it('accepts a V/°C Vmp coefficient', () => {
    const d = stringVmpAtCellTemperature('k', '', { ...module, vmpCoefficient: { value: -0.1, unit: 'V/°C' } }, 2, 75)
    expect(d.value).toBeCloseTo(2 * (31 - 5), 9)
  })

  it('fails below the start voltage, warns below the MPPT minimum and above the maximum', () => {
    const statuses = (hot: number, cold: number) => checkMpptWindow(2023, 'string.S1', hot, cold, input).map((d) => d.status)
    expect(statuses(271, 357)).toEqual(['pass', 'pass', 'pass'])
    expect(statuses(110, 357)).toEqual(['fail', 'pass', 'pass'])
    expect(statuses(121, 357)).toEqual(['pass', 'pass', 'pass'])
    expect(statuses(95, 490)).toEqual(['fail', 'warn', 'warn'])
  })

  // NFPA 70 110.3(B) (2017, 2020, 2023): equipment used per its listing (value from memory)
  it('holds 125 % of the paralleled Isc to the input\u2019s short-circuit rating and flags clipping', () => {
    const [isc, operating] = checkMpptCurrent(2020, 'input.INV1.mppt1', 17.25, 12.9, input)
    expect(isc?.status).toBe('pass')
    expect(isc?.reference).toBe('NEC 2020 110.3(B)')
    expect(operating?.status).toBe('pass')
    const [iscTwo, clipping] = checkMpptCurrent(2020, 'k', 34.5, 25.8, input)
    expect(iscTwo?.status).toBe('fail')
    expect(clipping?.status).toBe('warn')
  })
})
