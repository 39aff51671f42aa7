import { describe, expect, it } from 'vitest'
import { cautionLines, fixedCautionLines } from '../../shared/cautions'

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
})
