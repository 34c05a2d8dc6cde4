/**
 * Tank volume from shape and inside dimensions (centimetres in, litres out), gross
 * and net of what the sand and rock displace.
 */

import { assertFinite, assertPositive } from '../units'

/** Inside dimensions of a tank, by shape. All lengths in cm. */
export type TankShape =
  | { kind: 'rectangular', lengthCm: number, widthCm: number, heightCm: number }
  | { kind: 'cube', sideCm: number }
  | { kind: 'cylinder', diameterCm: number, heightCm: number }
  /** Rectangle `lengthCm` x `widthCm` plus a circular-arc front bulging `bowCm` at its centre. */
  | { kind: 'bow-front', lengthCm: number, widthCm: number, bowCm: number, heightCm: number }
  /** Quarter-cylinder for a room corner; `radiusCm` is the length of each straight side. */
  | { kind: 'corner', radiusCm: number, heightCm: number }
  /** Regular hexagonal prism; `sideCm` is one edge of the hexagon. */
  | { kind: 'hexagonal', sideCm: number, heightCm: number }

export type TankShapeKind = TankShape['kind']

/** Footprint area (cm^2), perimeter (cm) and height (cm) of a shape. */
export interface ShapeGeometry {
  footprintCm2: number
  perimeterCm: number
  heightCm: number
}

/** Area and arc length of the circular segment with chord `chord` and height `sagitta`. */
function circularSegment(chord: number, sagitta: number): { area: number, arc: number } {
  if (sagitta === 0) return { area: 0, arc: chord }
  const radius = (chord * chord) / (8 * sagitta) + sagitta / 2
  const angle = 2 * Math.asin(Math.min(1, chord / (2 * radius)))
  return { area: (radius * radius * (angle - Math.sin(angle))) / 2, arc: radius * angle }
}

/** Footprint, perimeter and height of a tank shape; throws on non-positive dimensions. */
export function shapeGeometry(shape: TankShape): ShapeGeometry {
  switch (shape.kind) {
    case 'rectangular': {
      const { lengthCm: l, widthCm: w, heightCm: h } = shape
      assertPositive('lengthCm', l)
      assertPositive('widthCm', w)
      assertPositive('heightCm', h)
      return { footprintCm2: l * w, perimeterCm: 2 * (l + w), heightCm: h }
    }
    case 'cube': {
      assertPositive('sideCm', shape.sideCm)
      const s = shape.sideCm
      return { footprintCm2: s * s, perimeterCm: 4 * s, heightCm: s }
    }
    case 'cylinder': {
      assertPositive('diameterCm', shape.diameterCm)
      assertPositive('heightCm', shape.heightCm)
      const r = shape.diameterCm / 2
      return { footprintCm2: Math.PI * r * r, perimeterCm: Math.PI * shape.diameterCm, heightCm: shape.heightCm }
    }
    case 'bow-front': {
      const { lengthCm: l, widthCm: w, bowCm: b, heightCm: h } = shape
      assertPositive('lengthCm', l)
      assertPositive('widthCm', w)
      assertPositive('heightCm', h)
      // A bow deeper than half the length would no longer be a single arc over the front.
      assertFinite('bowCm', b, { min: 0, max: l / 2 })
      const segment = circularSegment(l, b)
      return { footprintCm2: l * w + segment.area, perimeterCm: l + 2 * w + segment.arc, heightCm: h }
    }
    case 'corner': {
      assertPositive('radiusCm', shape.radiusCm)
      assertPositive('heightCm', shape.heightCm)
      const r = shape.radiusCm
      return { footprintCm2: (Math.PI * r * r) / 4, perimeterCm: 2 * r + (Math.PI * r) / 2, heightCm: shape.heightCm }
    }
    case 'hexagonal': {
      assertPositive('sideCm', shape.sideCm)
      assertPositive('heightCm', shape.heightCm)
      const s = shape.sideCm
      return { footprintCm2: ((3 * Math.sqrt(3)) / 2) * s * s, perimeterCm: 6 * s, heightCm: shape.heightCm }
    }
  }
}

/** Aragonite mineral density, g/cm3 (reference.md §7). */
export const ARAGONITE_DENSITY_G_CM3 = 2.93
/** Pore fraction of a settled sand bed; 0.40-0.50 is typical (from memory). */
export const DEFAULT_SAND_POROSITY = 0.45

/** What goes in the tank besides water. */
export interface VolumeInput {
  shape: TankShape
  /** Gap between the rim and the water surface, cm (0 = filled to the rim). */
  freeboardCm?: number
  /** Sand bed depth, cm. */
  sandDepthCm?: number
  /** Pore fraction of the sand bed: pore water counts as tank water. */
  sandPorosity?: number
  /** Dry mass of rock, kg. */
  rockKg?: number
  /** Density of the rock's solid mineral, g/cm3; water in the rock's pores counts as tank water. */
  rockDensityGCm3?: number
}

/** Gross and net water volume of a tank. */
export interface VolumeResult {
  footprintCm2: number
  /** Inside volume up to the water line, L. */
  grossL: number
  /** Solid sand grains below the water, L. */
  sandDisplacementL: number
  /** Solid rock, L. */
  rockDisplacementL: number
  /** Water actually in the tank, L. */
  netL: number
}

/** Gross inside volume to the rim, litres. */
export function grossVolumeL(shape: TankShape): number {
  const g = shapeGeometry(shape)
  return (g.footprintCm2 * g.heightCm) / 1000
}

/** Water volume gross and net of sand and rock displacement. */
export function tankVolume(input: VolumeInput): VolumeResult {
  const g = shapeGeometry(input.shape)
  const freeboardCm = input.freeboardCm ?? 0
  const sandDepthCm = input.sandDepthCm ?? 0
  const porosity = input.sandPorosity ?? DEFAULT_SAND_POROSITY
  const rockKg = input.rockKg ?? 0
  const rockDensity = input.rockDensityGCm3 ?? ARAGONITE_DENSITY_G_CM3
  assertFinite('freeboardCm', freeboardCm, { min: 0, max: g.heightCm })
  assertFinite('sandDepthCm', sandDepthCm, { min: 0, max: g.heightCm - freeboardCm })
  assertFinite('sandPorosity', porosity, { min: 0, max: 0.9 })
  assertFinite('rockKg', rockKg, { min: 0 })
  assertFinite('rockDensityGCm3', rockDensity, { min: 1, max: 5 })

  const grossL = (g.footprintCm2 * (g.heightCm - freeboardCm)) / 1000
  const sandDisplacementL = (g.footprintCm2 * sandDepthCm * (1 - porosity)) / 1000
  const rockDisplacementL = rockKg / rockDensity
  const netL = grossL - sandDisplacementL - rockDisplacementL
  if (netL < 0) throw new RangeError(`rockKg ${rockKg} displaces more than the tank holds (net volume ${netL.toFixed(1)} L)`)
  return { footprintCm2: g.footprintCm2, grossL, sandDisplacementL, rockDisplacementL, netL }
}
