// The import page's description of the pull file, held against the parser itself: every
// example header is read as the column it describes, every unit listed is accepted, and
// the sample file imports without a single problem. Source of the power check: hp =
// lb-ft x rpm / 5252.113 (550 ft-lbf/s per hp, the mechanical horsepower; product brief).
import { describe, expect, it } from 'vitest'
import {
  PULL_FILE_COLUMNS, SAMPLE_PULL_WEATHER, parsePullCsv, powerHp, samplePullCsv,
} from '../../../shared/dyno/index'

// A small file with rpm, torque and the column under test (a value that fits every unit).
const rows = (header: string) => [`RPM,${/torque/i.test(header) ? 'Power (hp)' : 'Torque (lb-ft)'},${header}`, ...Array.from({ length: 12 }, (_, i) => `${3000 + i * 100},${400 + i},12.5`)].join('\n')

describe('the pull file as the import page describes it', () => {
  it('each example header is read as its column', () => {
    const roles = PULL_FILE_COLUMNS.map((c) => {
      const parsed = parsePullCsv(rows(c.example === 'RPM' ? 'Extra' : c.example))
      return parsed.columns.find(col => col.header === c.example)?.role
    })
    expect(roles).toEqual(['rpm', 'torque-lb-ft', 'power-hp', 'vacuum-inhg', 'afr'])
  })

  it('every unit listed is accepted without a problem', () => {
    for (const c of PULL_FILE_COLUMNS.filter(col => col.name !== 'Engine speed' && col.units.length)) {
      for (const unit of c.units) {
        const header = `${c.example.replace(/\s*\(.*\)$/, '')} (${unit})`
        const parsed = parsePullCsv(rows(header))
        const role = parsed.columns.find(col => col.header === header)?.role
        expect(role, `${header}`).not.toMatch(/^(extra|ignore)$/)
        expect(parsed.problems.filter(p => p.severity === 'error'), header).toEqual([])
      }
    }
  })

  it('the sample file imports cleanly: no errors, no warnings, its weather read from its lines', () => {
    const parsed = parsePullCsv(samplePullCsv())
    expect(parsed.ok).toBe(true)
    expect(parsed.problems).toEqual([])
    expect(parsed.weather).toEqual(SAMPLE_PULL_WEATHER)
    expect(parsed.points).toHaveLength(41)
    expect(parsed.points[0]!.rpm).toBe(2500)
    expect(parsed.points.at(-1)!.rpm).toBe(6500)
    // Power agrees with torque row by row (within the file's one decimal).
    for (const p of parsed.points) expect(Math.abs(powerHp(p.torqueLbFt, p.rpm) - p.powerHp)).toBeLessThan(0.2)
  })

  it('the sample says it is invented and is formula-safe', () => {
    const text = samplePullCsv()
    expect(text).toMatch(/synthetic pull, invented data/)
    // No cell a spreadsheet would run as a formula (a cell starting with = + - @).
    const cells = text.split('\r\n').filter(l => l && !l.startsWith('#')).flatMap(l => l.split(','))
    expect(cells.filter(c => /^[=+@]/.test(c) || /^-[^\d]/.test(c))).toEqual([])
    expect(samplePullCsv()).toBe(text)
  })
})
