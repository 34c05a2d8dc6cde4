import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { DEFAULT_SAND_POROSITY, grossVolumeL, shapeGeometry, tankVolume, type TankShape } from '../../../../shared/calc/volume'
import { convertVolume, inchesToCm } from '../../../../shared/units'

const FC = { seed: 7, numRuns: 200 }

describe('gross volume by shape', () => {
  it('rectangular 120 x 50 x 50 cm holds 300 L', () => {
    expect(grossVolumeL({ kind: 'rectangular', lengthCm: 120, widthCm: 50, heightCm: 50 })).toBeCloseTo(300, 10)
  })

  it('an 11 x 7 x 3 in box is 231 in^3 = one US gallon (definition of the US gallon)', () => {
    const l = grossVolumeL({ kind: 'rectangular', lengthCm: inchesToCm(11), widthCm: inchesToCm(7), heightCm: inchesToCm(3) })
    expect(convertVolume(l, 'L', 'usgal')).toBeCloseTo(1, 12)
  })

  it('cube of 50 cm holds 125 L', () => {
    expect(grossVolumeL({ kind: 'cube', sideCm: 50 })).toBeCloseTo(125, 10)
  })

  it('cylinder uses pi r^2 h with the diameter halved', () => {
    expect(grossVolumeL({ kind: 'cylinder', diameterCm: 20, heightCm: 10 })).toBeCloseTo(Math.PI, 10)
  })

  it('corner quarter-cylinder is a quarter of the full cylinder', () => {
    const quarter = grossVolumeL({ kind: 'corner', radiusCm: 60, heightCm: 50 })
    expect(quarter * 4).toBeCloseTo(grossVolumeL({ kind: 'cylinder', diameterCm: 120, heightCm: 50 }), 9)
  })

  it('hexagonal prism is six equilateral triangles', () => {
    const s = 30
    expect(grossVolumeL({ kind: 'hexagonal', sideCm: s, heightCm: 60 })).toBeCloseTo((6 * (Math.sqrt(3) / 4) * s * s * 60) / 1000, 9)
  })

  it('bow-front: no bow is the rectangle, a half-length bow adds a half disc', () => {
    const flat = grossVolumeL({ kind: 'bow-front', lengthCm: 100, widthCm: 40, bowCm: 0, heightCm: 50 })
    expect(flat).toBeCloseTo(200, 10)
    const semi = grossVolumeL({ kind: 'bow-front', lengthCm: 100, widthCm: 40, bowCm: 50, heightCm: 50 })
    expect(semi).toBeCloseTo(((4000 + (Math.PI * 2500) / 2) * 50) / 1000, 9)
  })

  it('bow-front: a shallow bow adds the circular segment, not a triangle or a rectangle', () => {
    // chord 100, sagitta 10: R = 130, segment area = R^2/2 (theta - sin theta), theta = 2 asin(50/130)
    const theta = 2 * Math.asin(50 / 130)
    const segment = (130 * 130 / 2) * (theta - Math.sin(theta))
    const g = shapeGeometry({ kind: 'bow-front', lengthCm: 100, widthCm: 40, bowCm: 10, heightCm: 50 })
    expect(g.footprintCm2 - 4000).toBeCloseTo(segment, 9)
    expect(segment).toBeGreaterThan(0.5 * 100 * 10) // more than the inscribed triangle
    expect(segment).toBeLessThan(100 * 10) // less than the bounding rectangle
  })

  it('rejects impossible dimensions, naming them', () => {
    expect(() => grossVolumeL({ kind: 'rectangular', lengthCm: 0, widthCm: 50, heightCm: 50 })).toThrow(/lengthCm/)
    expect(() => grossVolumeL({ kind: 'cylinder', diameterCm: Number.NaN, heightCm: 50 })).toThrow(/diameterCm/)
    expect(() => grossVolumeL({ kind: 'bow-front', lengthCm: 100, widthCm: 40, bowCm: 51, heightCm: 50 })).toThrow(/bowCm/)
    expect(() => grossVolumeL({ kind: 'hexagonal', sideCm: -1, heightCm: 50 })).toThrow(/sideCm/)
  })
})

describe('net of sand and rock', () => {
  const shape: TankShape = { kind: 'rectangular', lengthCm: 120, widthCm: 50, heightCm: 50 }

  it('subtracts sand grains (pore water stays) and rock mineral volume', () => {
    const v = tankVolume({ shape, sandDepthCm: 4, rockKg: 30, freeboardCm: 2 })
    expect(v.grossL).toBeCloseTo(288, 10)
    expect(v.sandDisplacementL).toBeCloseTo(6000 * 4 * (1 - DEFAULT_SAND_POROSITY) / 1000, 10)
    expect(v.rockDisplacementL).toBeCloseTo(30 / 2.93, 10) // aragonite 2.93 g/cm3 (reference.md §7)
    expect(v.netL).toBeCloseTo(v.grossL - v.sandDisplacementL - v.rockDisplacementL, 10)
  })

  it('an empty tank nets its gross volume', () => {
    expect(tankVolume({ shape }).netL).toBeCloseTo(300, 10)
  })

  it('rejects sand above the water line and rock that cannot fit', () => {
    expect(() => tankVolume({ shape, sandDepthCm: 49, freeboardCm: 2 })).toThrow(/sandDepthCm/)
    expect(() => tankVolume({ shape, rockKg: 5000 })).toThrow(/rockKg/)
    expect(() => tankVolume({ shape, sandPorosity: 1.2 })).toThrow(/sandPorosity/)
  })

  it('property: net <= gross, finite, and volume scales with the cube of size', () => {
    fc.assert(fc.property(
      fc.double({ min: 10, max: 300, noNaN: true }),
      fc.double({ min: 10, max: 100, noNaN: true }),
      fc.double({ min: 20, max: 100, noNaN: true }),
      fc.double({ min: 0, max: 10, noNaN: true }),
      (l, w, h, sand) => {
        const v = tankVolume({ shape: { kind: 'rectangular', lengthCm: l, widthCm: w, heightCm: h }, sandDepthCm: sand })
        const big = grossVolumeL({ kind: 'rectangular', lengthCm: 2 * l, widthCm: 2 * w, heightCm: 2 * h })
        return Number.isFinite(v.netL) && v.netL <= v.grossL && v.netL > 0 && Math.abs(big - 8 * v.grossL) < 1e-9 * big
      },
    ), FC)
  })
})
