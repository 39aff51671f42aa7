import { describe, expect, it } from 'vitest'
import { cautionLines, fixedCautionLines, shortFixedCautionLines } from '../../shared/cautions'

describe('cautions', () => {
  it('always carries legal age with its number, driving, pregnancy, medicines and local law', () => {
    const lines = cautionLines({ legalAge: 18, cautions: '' })
    expect(lines.join(' ')).toMatch(/18 or older/)
    expect(lines.join(' ')).toMatch(/driving, please do not drink/)
    expect(lines.join(' ')).toMatch(/pregnant/)
    expect(lines.join(' ')).toMatch(/medicines/)
    expect(lines.join(' ')).toMatch(/local law/)
  })
  it('keeps the fixed block when the venue empties its own lines, and adds the venue lines after it', () => {
    const fixed = fixedCautionLines({ legalAge: 21 })
    expect(cautionLines({ legalAge: 21, cautions: '' })).toEqual(fixed)
    expect(cautionLines({ legalAge: 21, cautions: 'Water is on every table.\n\n  Ask us for a taxi.  ' })).toEqual([...fixed, 'Water is on every table.', 'Ask us for a taxi.'])
  })
  it('puts the standard drinks of what is poured first, and does not repeat a fixed line the venue also wrote', () => {
    const fixed = fixedCautionLines({ legalAge: 21 })
    const lines = cautionLines({ legalAge: 21, cautions: fixed[1]! }, { standardDrinksLine: 'This pour holds 0.5 standard drinks.' })
    expect(lines[0]).toBe('This pour holds 0.5 standard drinks.')
    expect(lines.filter(l => l === fixed[1])).toHaveLength(1)
  })
  it('says the same five things in its short form for the card, one line for each long one', () => {
    const long = fixedCautionLines({ legalAge: 19 })
    const short = shortFixedCautionLines({ legalAge: 19 })
    expect(short).toHaveLength(long.length)
    // The words each pair must share: what the caution is about.
    const topics = [/19 or older/, /driving/i, /pregnant/i, /medicines/i, /local law and their licence/]
    topics.forEach((t, i) => {
      expect(long[i]).toMatch(t)
      expect(short[i]).toMatch(t)
      expect(short[i]!.length).toBeLessThan(long[i]!.length + 1)
    })
    expect(cautionLines({ legalAge: 19, cautions: 'Ask us for a taxi.' }, { short: true })).toEqual([...short, 'Ask us for a taxi.'])
  })
})
