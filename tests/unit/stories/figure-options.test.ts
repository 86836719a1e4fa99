// Figure options as MDC hands them over (every value the string the writer wrote),
// read without zod by shared/types/story-figures.ts: the server on save, the
// editor's picker and the figure components in the reader's browser all use these.
import { describe, expect, it } from 'vitest'
import { setupsUsed } from '#shared/utils/story-figure-use'
import { CamCardProps, DayReportProps, FigureValueProps, GainGraphProps, GalleryProps, PhotoProps, PullGraphProps, ResultsTableProps } from '#shared/types/story-figures'

const issuesOf = (result: { success: boolean, error?: { issues: { path: (string | number)[], message: string }[] } }) =>
  result.success ? [] : result.error!.issues.map(i => [i.path.join('.'), i.message])

describe('reading figure options', () => {
  it('turns the written text into numbers and lists, each id once', () => {
    expect(PullGraphProps.safeParse({ setups: ' 12, 13,12', channel: 'torque', from: '2500', to: '6500', caption: 'Cam A' }))
      .toEqual({ success: true, data: { setups: [12, 13], channel: 'torque', from: 2500, to: 6500, caption: 'Cam A' } })
    expect(GainGraphProps.safeParse({ baseline: '11', setups: [12, '13'] })).toEqual({ success: true, data: { baseline: 11, setups: [12, 13], channel: 'both' } })
  })

  it('fills in the defaults and leaves out options not written', () => {
    expect(PullGraphProps.safeParse({})).toEqual({ success: true, data: { channel: 'both' } })
    expect(PhotoProps.safeParse({ id: '40' })).toEqual({ success: true, data: { id: 40, size: 'wide' } })
    expect(ResultsTableProps.safeParse({})).toEqual({ success: true, data: {} })
  })

  it('names the options each figure takes, in the order they are read', () => {
    expect(PullGraphProps.names).toEqual(['setups', 'channel', 'from', 'to', 'caption'])
    expect(FigureValueProps.names).toEqual(['of', 'setup', 'vs', 'decimals'])
  })

  it.each([
    [{ setup: 'x' }, [['setup', 'Use a number id']]],
    [{ setup: '2.5' }, [['setup', 'Use a whole-number id']]],
    [{ setup: '0' }, [['setup', 'Use an id above 0']]],
    [{}, [['setup', 'Use a number id']]],
    [{ setup: '12', colour: 'red' }, [['', '"colour" is not an option of this figure']]],
    [{ setup: '12', caption: 'x'.repeat(501) }, [['caption', 'Keep the caption under 500 characters']]],
  ])('locates what is wrong with cam card options %j', (input, issues) => {
    expect(issuesOf(CamCardProps.safeParse(input))).toEqual(issues)
  })

  it('checks an id list as a whole', () => {
    expect(issuesOf(GalleryProps.safeParse({ ids: '40,,41' }))).toEqual([['ids', 'Use ids separated by commas, like "12,13"']])
    expect(issuesOf(GalleryProps.safeParse({ ids: [] }))).toEqual([['ids', 'Name from 1 to 24 ids']])
    expect(issuesOf(GalleryProps.safeParse({ ids: Array.from({ length: 25 }, (_, i) => i + 1).join(',') }))).toEqual([['ids', 'Name from 1 to 24 ids']])
    expect(issuesOf(GalleryProps.safeParse({ ids: [40, 'x'] }))).toEqual([['ids', 'Use a number id']])
  })

  it('keeps rpm plausible and in order, judging the order only when both ends read', () => {
    expect(issuesOf(PullGraphProps.safeParse({ from: '6000', to: '3000' }))).toEqual([['to', '"from" is below "to"']])
    expect(issuesOf(PullGraphProps.safeParse({ from: '30000', to: '3000' }))).toEqual([['from', 'Above 20,000 rpm is not plausible']])
    expect(issuesOf(PullGraphProps.safeParse({ from: '-100' }))).toEqual([['from', 'Use an rpm of 0 or more']])
    expect(issuesOf(PullGraphProps.safeParse({ to: '6500.5' }))).toEqual([['to', 'Use a whole rpm']])
    expect(issuesOf(PullGraphProps.safeParse({ channel: 'boost' }))).toEqual([['channel', 'Use one of "both", "power", "torque"']])
  })

  it('reads an inline value\'s figure, setups and decimals', () => {
    expect(FigureValueProps.safeParse({ of: 'peak-power-gain', setup: '13', vs: '12', decimals: '1' }))
      .toEqual({ success: true, data: { of: 'peak-power-gain', setup: 13, vs: 12, decimals: 1 } })
    expect(issuesOf(FigureValueProps.safeParse({ of: 'boost', setup: '13', decimals: '3' })))
      .toEqual([['of', 'Choose a figure the data gives'], ['decimals', 'Use 0, 1 or 2 decimals']])
  })

  it('refuses anything but a set of options', () => {
    expect(issuesOf(PullGraphProps.safeParse(null))).toEqual([['', 'Give the options as name=value pairs']])
    expect(issuesOf(PullGraphProps.safeParse(['12']))).toEqual([['', 'Give the options as name=value pairs']])
  })
})

describe('the test day figure', () => {
  it('shows the sentences and the table unless told otherwise, and names a wrong choice', () => {
    expect(DayReportProps.safeParse({})).toEqual({ success: true, data: { show: 'both' } })
    expect(DayReportProps.safeParse({ show: 'summary', caption: 'How the day went' })).toEqual({ success: true, data: { show: 'summary', caption: 'How the day went' } })
    expect(issuesOf(DayReportProps.safeParse({ show: 'all' }))).toEqual([['show', 'Use one of "both", "summary", "table"']])
  })

  it('asks for the day only when the body shows it', () => {
    expect(setupsUsed('::day-report{show="table"}\n::').dayReport).toBe(true)
    expect(setupsUsed('::pull-graph\n::\n\n::spec-box\n::').dayReport).toBe(false)
  })
})
