import { describe, expect, it } from 'vitest'
import { filledWeight } from '../../../../shared/calc/weight'
import { plannedContents, surveyLoad } from '../../../../shared/plan/survey-load'

const tank = { shape: 'rectangular', dimensions: { lengthMm: 1200, widthMm: 600, heightMm: 600 }, material: 'glass' as const, sumpLitres: 0 }
const survey = { key: 'site-survey', data: { roomUse: 'living-area', shellThicknessMm: 12 } }

describe('surveyLoad', () => {
  it('adds the sand the substrate stage records and the rock the fill stage records', () => {
    const bare = surveyLoad(tank, [survey])!
    const full = surveyLoad(tank, [survey, { key: 'substrate', data: { depthMm: 40 } }, { key: 'water-fill', data: { rockKg: 40 } }])!
    expect(bare.sandKg).toBe(0)
    expect(full.sandKg).toBeGreaterThan(40)
    expect(full.rockKg).toBe(40)
    // Sand and rock displace some water but weigh far more than it: the filled weight rises by several percent.
    expect(full.totalKg / bare.totalKg).toBeGreaterThan(1.05)
    expect(full).toEqual(filledWeight({ shape: { kind: 'rectangular', lengthMm: 1200, widthMm: 600, heightMm: 600 }, salinity: 35, temperatureC: 25, shellMaterial: 'glass', shellThicknessMm: 12, sandDepthMm: 40, rockKg: 40, otherKg: 0, roomUse: 'living-area' }))
  })
  it('compares with the occupancy the survey records, and is null without dimensions', () => {
    const office = surveyLoad(tank, [{ key: 'site-survey', data: { roomUse: 'office' } }])!
    expect(office.designLiveLoadPsf).toBe(50)
    expect(surveyLoad({ ...tank, dimensions: {} }, [survey])).toBeNull()
  })
  it('reads nothing from values that are not numbers', () => {
    expect(plannedContents([{ key: 'substrate', data: { depthMm: 'deep' } }])).toEqual({ sandDepthMm: 0, rockKg: 0 })
  })
})
