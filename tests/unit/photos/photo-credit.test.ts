import { describe, expect, it } from 'vitest'
import { bareCredit, creditLine } from '#shared/utils/photo-credit'

// Caption style: one "Photo:" label before the credit (common practice in magazine captions).
describe('photo credits', () => {
  it('drops a label the author typed, so it never reads "Photo: Photo:"', () => {
    expect(creditLine('Photo: R. Vance')).toBe('Photo: R. Vance')
    expect(creditLine('photos by Tall Oak Speed Shop')).toBe('Photo: Tall Oak Speed Shop')
    expect(creditLine('Photograph - M. Ortiz')).toBe('Photo: M. Ortiz')
    expect(creditLine('  PHOTO:  staff ')).toBe('Photo: staff')
  })

  it('leaves a credit alone that merely starts with a similar word', () => {
    expect(bareCredit('Photofinish Studio')).toBe('Photofinish Studio')
    expect(creditLine('Pictured Rocks Garage')).toBe('Photo: Pictured Rocks Garage')
  })

  it('says nothing without a credit, or with only the label', () => {
    expect(creditLine('')).toBe('')
    expect(creditLine(null)).toBe('')
    expect(creditLine('Photo:')).toBe('')
  })
})
