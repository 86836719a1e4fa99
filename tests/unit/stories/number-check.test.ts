import { describe, expect, it } from 'vitest'
import { agrees, checkNumbers, comparedPairs, figureCandidates, findProseNumbers, pairsNamedInBody } from '#shared/utils/number-check'
import { BASE, CAM, HEADERS, source } from './figure-source'

const candidates = () => figureCandidates(source())
const check = (text: string) => checkNumbers(text, candidates())

describe('numbers in the prose', () => {
  it('finds numbers with the units the data speaks to, in their many spellings', () => {
    const found = findProseNumbers('It made 488 hp and 462 lb-ft (462 ft-lbs, 462 lb.-ft.) at 6,190 rpm; 17.5 in. Hg at idle, a 6.4% gain, 5.7 percent, a 20-hp gain, 31.4 horsepower.')
    expect(found.map(f => [f.value, f.unit])).toEqual([
      [488, 'hp'], [462, 'lb-ft'], [462, 'lb-ft'], [462, 'lb-ft'], [6190, 'rpm'], [17.5, 'inHg'], [6.4, '%'], [5.7, '%'], [20, 'hp'], [31.4, 'hp'],
    ])
    expect(found[9]!.decimals).toBe(1)
  })

  it('reads both ends of a range', () => {
    expect(findProseNumbers('from 3,800-6,200 rpm and 2500 to 6500 rpm').map(f => f.value)).toEqual([3800, 6200, 2500, 6500])
  })

  it('leaves out figure markup, code, link targets and numbers without a unit', () => {
    const body = 'At 10:30 the 350 engine ran. `400 hp` :figure-value{of="peak-power" setup=11} [x](https://e.example/500-hp)\n::pull-graph{from=2500 to=6500}\n::'
    expect(findProseNumbers(body)).toEqual([])
  })

  it('gives the line of each number', () => {
    expect(findProseNumbers('one\n\nit made 488 hp').map(f => f.line)).toEqual([3])
  })
})

describe('agreement after reporting rounding', () => {
  it.each([
    [487.5, { value: 488, decimals: 0, unit: 'hp' as const }, true], // product brief: 487.5 hp reads 488 hp
    [487.49, { value: 488, decimals: 0, unit: 'hp' as const }, false],
    [31.4, { value: 31, decimals: 0, unit: 'hp' as const }, true],
    [31.45, { value: 31.5, decimals: 1, unit: 'hp' as const }, true],
    [-16.1, { value: 16, decimals: 0, unit: 'lb-ft' as const }, true], // "lost 16 lb-ft"
    [6190, { value: 6200, decimals: 0, unit: 'rpm' as const }, true], // rpm to the hundred (common practice)
    [6140, { value: 6100, decimals: 0, unit: 'rpm' as const }, true],
    [6160, { value: 6100, decimals: 0, unit: 'rpm' as const }, false],
    [498, { value: 500, decimals: 0, unit: 'hp' as const }, false], // hp is never rounded to tens
  ])('%d reads as %o: %s', (figure, written, expected) => {
    expect(agrees(figure, written)).toBe(expected)
  })
})

describe('the number check', () => {
  it('passes right figures, whichever way they are rounded', () => {
    const findings = check('The baseline made 488 hp at 6,200 rpm. The cam added 31 hp (31.4 hp, 6.4%) peak to peak, lost 16 lb-ft at 3,000 rpm, crossed over at 4,180 rpm and dropped idle vacuum to 14.0 inHg.')
    expect(findings.length).toBe(9)
    for (const f of findings) expect(f.matched, f.message).toBeDefined()
  })

  it('flags a wrong figure and names the nearest the data gives', () => {
    const [finding] = check('The cam added 35 hp peak to peak.')
    expect(finding!.matched).toBeUndefined()
    expect(finding!.nearest[0]).toEqual({ label: 'Peak-to-peak power gain, Long cam vs Baseline', value: 31.4, unit: 'hp' })
    expect(finding!.message).toBe('Text says 35 hp; the data gives 31.4 hp (Peak-to-peak power gain, Long cam vs Baseline).')
  })

  it('warns when a quoted gain is within repeatability', () => {
    const [finding] = check('The headers added 13 hp.')
    expect(finding!.matched?.withinRepeatability).toBe(true)
    expect(finding!.message).toMatch(/within repeatability/)
  })

  it('flags every number when no figure has its unit', () => {
    const [finding] = checkNumbers('It made 488 hp.', [])
    expect(finding!.matched).toBeUndefined()
    expect(finding!.message).toBe('Text says 488 hp; the data gives no figure in hp.')
  })

  it('checks barometer readings against the pulls', () => {
    const s = { ...source(), pullWeather: [{ setupId: BASE, weather: { baroInHg: 29.31, airTempF: 70, humidityPct: 40 } }] }
    const [finding] = checkNumbers('The barometer read 29.31 inHg.', figureCandidates(s))
    expect(finding!.matched?.label).toBe('Barometer of a pull, Baseline')
  })
})

describe('pairs compared', () => {
  it('takes each row against the baseline and the setup before, once each', () => {
    expect(comparedPairs(source())).toEqual([
      { setupId: CAM, vsSetupId: BASE },
      { setupId: HEADERS, vsSetupId: BASE },
      { setupId: HEADERS, vsSetupId: CAM },
    ])
  })

  it('adds pairs the body names in inline values and gain graphs', () => {
    const body = 'X :figure-value{of="peak-power-gain" setup=11 vs=12} Y\n::gain-graph{baseline=13 setups="12"}\n::'
    expect(pairsNamedInBody(body, BASE)).toEqual([{ setupId: BASE, vsSetupId: CAM }, { setupId: CAM, vsSetupId: HEADERS }])
    const named = comparedPairs(source(), pairsNamedInBody(body, BASE))
    expect(named).toContainEqual({ setupId: BASE, vsSetupId: CAM })
    // A pair with no comparison gives no candidates rather than wrong ones.
    const labels = figureCandidates(source(), named).map(c => c.label)
    expect(labels.some(l => l.includes('Long cam vs Long cam + headers'))).toBe(false)
    expect(labels).toContain('Peak-to-peak power gain, Baseline vs Long cam')
  })
})
