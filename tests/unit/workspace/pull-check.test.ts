import { describe, expect, it } from 'vitest'
import { capProblems, checkPullFile, countLines, decodeUploadedBytes, problemText, weatherProblems } from '../../../server/services/workspace/pull-check'

function file(rows = 21): string {
  const lines = ['# baro: 29.9 inHg', '# air temp: 70 F', '# humidity: 40 %', 'RPM,Torque (lb-ft)']
  for (let i = 0; i < rows; i++) lines.push(`${3000 + i * 100},${400 + i}`)
  return lines.join('\r\n')
}

describe('countLines', () => {
  it.each([['', 0], ['a', 1], ['a\n', 1], ['a\nb', 2], ['a\r\nb\r\n', 2], ['a\rb\rc', 3], ['\n\n', 2]])('%j has %i lines', (text, n) => {
    expect(countLines(text)).toBe(n)
  })
})

describe('problem text', () => {
  it('names the file, then line and column where known', () => {
    expect(problemText('a.csv', { severity: 'error', line: 4, column: 'RPM', message: 'x' })).toBe('a.csv, line 4, column "RPM": x')
    expect(problemText('a.csv', { severity: 'error', message: 'the file is empty' })).toBe('a.csv: the file is empty')
  })

  it('caps a flood of problems, errors first, saying how many more', () => {
    const many = [...Array.from({ length: 150 }, (_, i) => ({ severity: 'warning' as const, line: i, message: 'w' })), { severity: 'error' as const, message: 'e' }]
    const capped = capProblems(many, 10)
    expect(capped).toHaveLength(10)
    expect(capped[0]!.severity).toBe('error')
    expect(capped[9]!.message).toBe('and 142 more problems like these')
  })
})

describe('checkPullFile', () => {
  it('reads a good file into a preview with the weather of its lines', () => {
    const { preview, parsed } = checkPullFile({ name: 'good.csv', text: file() })
    expect(preview).toMatchObject({ ok: true, pointCount: 21, rpmFrom: 3000, rpmTo: 5000, rowCount: 25, weather: { baroInHg: 29.9, airTempF: 70, humidityPct: 40 } })
    expect(preview.peakTorque).toEqual({ value: 420, rpm: 5000 })
    expect(parsed!.points).toHaveLength(21)
  })

  it('refuses before parsing: empty, too big, too many lines, NUL, not UTF-8', () => {
    const refuse = (text: string, bytes?: number) => checkPullFile({ name: 'f.csv', text, bytes }).preview.problems.map(p => p.text)
    expect(refuse('  \n')).toEqual(['f.csv: the file is empty'])
    expect(refuse(file(), 5 * 1024 * 1024 + 1)[0]).toMatch(/^f\.csv: the file is 5\.0 MB; files up to 5\.0 MB are accepted/)
    expect(refuse('x\n'.repeat(200_001))[0]).toBe('f.csv: the file has 200,001 lines; up to 200,000 are accepted')
    expect(refuse('RPM\n1\n\u0000')[0]).toMatch(/^f\.csv, line 3: the file holds NUL bytes/)
    expect(refuse(decodeUploadedBytes(new Uint8Array([0x52, 0x50, 0x4d, 0x0a, 0xff, 0xfe])))[0]).toMatch(/^f\.csv, line 2: the file is not UTF-8/)
  })

  it('says when no column is usable, and when a mapping leaves no rpm', () => {
    const none = checkPullFile({ name: 'n.csv', text: 'a,b\n1,2\n' }).preview
    expect(none.ok).toBe(false)
    expect(none.problems[0]!.text).toBe('n.csv, line 1: none of the columns ("a", "b") is one Pullsheet reads: map them to rpm, torque or power')
    const mapped = checkPullFile({ name: 'm.csv', text: file(), mapping: { RPM: 'extra', Missing: 'afr' } }).preview
    const texts = mapped.problems.map(p => p.text)
    expect(texts).toContain('m.csv, line 4, column "Missing": the mapping names column "Missing", which the file does not have')
    expect(texts).toContain('m.csv, line 4: the column mapping leaves no rpm column: map one column to rpm')
  })
})

describe('weatherProblems', () => {
  it('needs weather unless the dyno corrected the pull', () => {
    expect(weatherProblems('w.csv', null, false, 'sae-j1349-1990')[0]!.severity).toBe('error')
    expect(weatherProblems('w.csv', null, true, 'sae-j1349-1990')).toEqual([])
  })

  it('refuses weather whose vapour pressure exceeds the barometer, warns on a factor far from 1 (common practice: 0.90 to 1.10)', () => {
    expect(weatherProblems('w.csv', { baroInHg: 2, airTempF: 140, humidityPct: 100 }, false, 'sae-j1349-1990')[0]!.text).toMatch(/^w\.csv: weather: vapour pressure/)
    const far = weatherProblems('w.csv', { baroInHg: 24, airTempF: 100, humidityPct: 20 }, false, 'sae-j1349-1990')
    expect(far.map(p => p.severity)).toEqual(['warning'])
    expect(weatherProblems('w.csv', { baroInHg: 29.5, airTempF: 77, humidityPct: 30 }, false, 'sae-j1349-1990')).toEqual([])
  })
})
