import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { DEFAULT_SAND_POROSITY, grossVolumeL, shapeGeometry, tankShapeFrom, tankVolume, type TankShape } from '../../../../shared/calc/volume'
import { convertLength, convertVolume } from '../../../../shared/units'

const inMm = (inches: number) => convertLength(inches, 'in', 'mm')

const FC = { seed: 7, numRuns: 200 }

describe('gross volume by shape', () => {
  it('rectangular 1200 x 500 x 500 mm holds 300 L', () => {
    expect(grossVolumeL({ kind: 'rectangular', lengthMm: 1200, widthMm: 500, heightMm: 500 })).toBeCloseTo(300, 10)
  })

  it('an 11 x 7 x 3 in box is 231 in^3 = one US gallon (definition of the US gallon)', () => {
    const l = grossVolumeL({ kind: 'rectangular', lengthMm: inMm(11), widthMm: inMm(7), heightMm: inMm(3) })
    expect(convertVolume(l, 'L', 'usgal')).toBeCloseTo(1, 12)
  })

  it('cube of 500 mm holds 125 L', () => {
    expect(grossVolumeL({ kind: 'cube', sideMm: 500 })).toBeCloseTo(125, 10)
  })

  it('cylinder uses pi r^2 h with the diameter halved', () => {
    expect(grossVolumeL({ kind: 'cylinder', diameterMm: 200, heightMm: 100 })).toBeCloseTo(Math.PI, 10)
  })

  it('corner quarter-cylinder is a quarter of the full cylinder', () => {
    const quarter = grossVolumeL({ kind: 'corner', radiusMm: 600, heightMm: 500 })
    expect(quarter * 4).toBeCloseTo(grossVolumeL({ kind: 'cylinder', diameterMm: 1200, heightMm: 500 }), 9)
  })

  it('hexagonal prism is six equilateral triangles', () => {
    const s = 300
    expect(grossVolumeL({ kind: 'hexagonal', sideMm: s, heightMm: 600 })).toBeCloseTo((6 * (Math.sqrt(3) / 4) * s * s * 600) / 1e6, 9)
  })

  it('bow-front: no bow is the rectangle, a half-length bow adds a half disc', () => {
    const flat = grossVolumeL({ kind: 'bow-front', lengthMm: 1000, widthMm: 400, bowDepthMm: 0, heightMm: 500 })
    expect(flat).toBeCloseTo(200, 10)
    const semi = grossVolumeL({ kind: 'bow-front', lengthMm: 1000, widthMm: 400, bowDepthMm: 500, heightMm: 500 })
    expect(semi).toBeCloseTo(((400000 + (Math.PI * 250000) / 2) * 500) / 1e6, 9)
  })

  it('bow-front: a shallow bow adds the circular segment, not a triangle or a rectangle', () => {
    // chord 1000, sagitta 100: R = 1300, segment area = R^2/2 (theta - sin theta), theta = 2 asin(500/1300)
    const theta = 2 * Math.asin(500 / 1300)
    const segment = (1300 * 1300 / 2) * (theta - Math.sin(theta))
    const g = shapeGeometry({ kind: 'bow-front', lengthMm: 1000, widthMm: 400, bowDepthMm: 100, heightMm: 500 })
    expect(g.footprintMm2 - 400000).toBeCloseTo(segment, 6)
    expect(segment).toBeGreaterThan(0.5 * 1000 * 100) // more than the inscribed triangle
    expect(segment).toBeLessThan(1000 * 100) // less than the bounding rectangle
  })

  it('rejects impossible dimensions, naming them', () => {
    expect(() => grossVolumeL({ kind: 'rectangular', lengthMm: 0, widthMm: 500, heightMm: 500 })).toThrow(/lengthMm/)
    expect(() => grossVolumeL({ kind: 'cylinder', diameterMm: Number.NaN, heightMm: 500 })).toThrow(/diameterMm/)
    expect(() => grossVolumeL({ kind: 'bow-front', lengthMm: 1000, widthMm: 400, bowDepthMm: 501, heightMm: 500 })).toThrow(/bowDepthMm/)
    expect(() => grossVolumeL({ kind: 'hexagonal', sideMm: -1, heightMm: 500 })).toThrow(/sideMm/)
  })

  it('builds a shape from stored dimensions and names a missing one', () => {
    expect(tankShapeFrom('cylinder', { diameterMm: 200, heightMm: 100, lengthMm: 5 })).toEqual({ kind: 'cylinder', diameterMm: 200, heightMm: 100 })
    expect(() => tankShapeFrom('bow-front', { lengthMm: 1000, widthMm: 400, heightMm: 500 })).toThrow(/bowDepthMm is required/)
  })
})

describe('net of sand and rock', () => {
  const shape: TankShape = { kind: 'rectangular', lengthMm: 1200, widthMm: 500, heightMm: 500 }

  it('subtracts sand grains (pore water stays) and rock mineral volume', () => {
    const v = tankVolume({ shape, sandDepthMm: 40, rockKg: 30, freeboardMm: 20 })
    expect(v.grossL).toBeCloseTo(288, 10)
    expect(v.footprintM2).toBeCloseTo(0.6, 12)
    expect(v.sandDisplacementL).toBeCloseTo(0.6 * 40 * (1 - DEFAULT_SAND_POROSITY), 10)
    expect(v.rockDisplacementL).toBeCloseTo(30 / 2.93, 10) // aragonite 2.93 g/cm3 (reference.md §7)
    expect(v.netL).toBeCloseTo(v.grossL - v.sandDisplacementL - v.rockDisplacementL, 10)
  })

  it('an empty tank nets its gross volume', () => {
    expect(tankVolume({ shape }).netL).toBeCloseTo(300, 10)
  })

  it('rejects sand above the water line and rock that cannot fit', () => {
    expect(() => tankVolume({ shape, sandDepthMm: 490, freeboardMm: 20 })).toThrow(/sandDepthMm/)
    expect(() => tankVolume({ shape, rockKg: 5000 })).toThrow(/rockKg/)
    expect(() => tankVolume({ shape, sandPorosity: 1.2 })).toThrow(/sandPorosity/)
  })

  it('property: net <= gross, finite, and volume scales with the cube of size', () => {
    fc.assert(fc.property(
      fc.double({ min: 100, max: 3000, noNaN: true }),
      fc.double({ min: 100, max: 1000, noNaN: true }),
      fc.double({ min: 200, max: 1000, noNaN: true }),
      fc.double({ min: 0, max: 100, noNaN: true }),
      (l, w, h, sand) => {
        const v = tankVolume({ shape: { kind: 'rectangular', lengthMm: l, widthMm: w, heightMm: h }, sandDepthMm: sand })
        const big = grossVolumeL({ kind: 'rectangular', lengthMm: 2 * l, widthMm: 2 * w, heightMm: 2 * h })
        return Number.isFinite(v.netL) && v.netL <= v.grossL && v.netL > 0 && Math.abs(big - 8 * v.grossL) < 1e-9 * big
      },
    ), FC)
  })
})
