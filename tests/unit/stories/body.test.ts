import { describe, expect, it } from 'vitest'
import { StoryBodySchema } from '#shared/types/stories'
import { bodySafetyIssues, figureProblems, photosUsed } from '#shared/utils/story-body'
import { findFigures, parseMdcAttributes, proseLines } from '#shared/utils/story-markup'

const ctx = { setupIds: new Set([11, 12, 13, 14]), analysedSetupIds: new Set([11, 12, 13]), photoIds: new Set([40, 41]) }

describe('figures in a body', () => {
  const body = [
    'Intro with :figure-value{of="peak-power-gain" setup=12 vs=11} of gain.',
    '',
    '::pull-graph{setups="11,12" channel="power" from=2500 to=6500}',
    '::',
    '```',
    '::results-table',
    '```',
    '::gallery{ids="40,41"}',
    '::',
  ].join('\n')

  it('finds block and inline figures with their lines, and not those in code', () => {
    const found = findFigures(body)
    expect(found.map(f => [f.kind, f.name, f.line])).toEqual([['inline', 'figure-value', 1], ['block', 'pull-graph', 3], ['block', 'gallery', 8]])
    expect(found[1]!.props).toEqual({ setups: '11,12', channel: 'power', from: '2500', to: '6500' })
  })

  it('reads MDC attributes with both quotes, bare values, flags, classes and ids', () => {
    expect(parseMdcAttributes(`{a="x y" b='z' c=3 d .wide #top}`)).toEqual({ a: 'x y', b: 'z', c: '3', d: 'true' })
  })

  it('passes valid figures', () => {
    expect(figureProblems(body, ctx)).toEqual([])
  })

  it.each([
    ['::boost-graph{setups="11"}', /not a figure/],
    ['::pull-graph{channel="boost"}', /channel/],
    ['::pull-graph{from=6000 to=3000}', /"from" is below "to"/],
    ['::pull-graph{setups="99"}', /Setup 99 is not a setup/],
    ['::pull-graph{setups="14"}', /Setup 14 has no included pulls/],
    ['::photo{id=77}', /Photo 77 is not a photo/],
    ['::cam-card{setup=12 colour="red"}', /colour/],
    ['::cam-card', /setup/],
    ['A :figure-value{of="boost" setup=12}.', /of/],
    ['A :figure{of="peak-power" setup=12}.', /figure-value/],
  ])('flags %s', (line, message) => {
    const problems = figureProblems(line, ctx)
    expect(problems.length).toBeGreaterThan(0)
    expect(problems.map(p => p.message).join(' ')).toMatch(message)
    expect(problems[0]!.line).toBe(1)
  })

  it('lets a cam card name a setup without pulls (its card needs no data)', () => {
    expect(figureProblems('::cam-card{setup=14}', ctx)).toEqual([])
  })

  it('lists the photos used once each', () => {
    expect(photosUsed('::photo{id=41}\n::\n::gallery{ids="40,41"}\n::')).toEqual([41, 40])
  })
})

describe('unsafe markup in a body', () => {
  it.each([
    ['<script>alert(1)</script>', /<script>/],
    ['<SCRIPT src="//x"></SCRIPT>', /<script>/],
    ['<img src=x onerror=alert(1)>', /event-handler/],
    ['<a href="#" onClick = "x()">a</a>', /event-handler/],
    ['[text]{onmouseover="alert(1)"}', /event-handler/],
    ['::photo{id=40 onclick="alert(1)"}', /event-handler/],
    ['[click](javascript:alert(1))', /javascript:/],
    ['[click](JaVaScRiPt:alert(1))', /javascript:/],
    ['[click](jav&#x61;script:alert(1))', /javascript:/],
    ['[click](&#106;avascript&colon;alert(1))', /javascript:/],
    ['[click](java\tscript:alert(1))', /javascript:/],
    ['<a href="java\nscript:alert(1)">x</a>', /javascript:/],
    ['<iframe srcdoc="x"></iframe>', /<iframe>/],
    ['<svg><circle/></svg>', /<svg>/],
    ['[x](data:text/html;base64,PHNjcmlwdD4=)', /data:text\/html/],
  ])('refuses %s', (body, message) => {
    const issues = bodySafetyIssues(body)
    expect(issues.length).toBeGreaterThan(0)
    expect(issues.map(i => i.message).join(' ')).toMatch(message)
    expect(StoryBodySchema.safeParse(body).success).toBe(false)
  })

  it('accepts ordinary prose, Markdown and figures', () => {
    const body = 'Turn on the ignition; the "on" switch.\n\n**Bold** [a link](https://example.com/x) <sup>2</sup>\n\n::photo{id=40}\n::\nA scriptwriter wrote it.'
    expect(bodySafetyIssues(body)).toEqual([])
    expect(StoryBodySchema.safeParse(body).success).toBe(true)
  })
})

describe('prose lines', () => {
  it('blanks markup but keeps lines and columns', () => {
    const lines = proseLines('Made 488 hp :figure-value{of="peak-power" setup=11} here `300 hp` [x](http://a/500hp)\n::pull-graph{from=2500}')
    expect(lines).toHaveLength(2)
    expect(lines[0]).toContain('488 hp')
    expect(lines[0]).not.toMatch(/300 hp|500hp|peak-power/)
    expect(lines[1]!.trim()).toBe('')
  })
})
