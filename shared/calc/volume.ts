/**
 * Tank volume from shape and inside dimensions (millimetres in, as the database
 * stores them; litres out), gross and net of what the sand and rock displace.
 */

import { assertFinite, assertPositive } from '../units'

/** Inside dimensions of a tank, by shape. All lengths in mm. */
export type TankShape
  = | { kind: 'rectangular', lengthMm: number, widthMm: number, heightMm: number }
    | { kind: 'cube', sideMm: number }
    | { kind: 'cylinder', diameterMm: number, heightMm: number }
  /** Rectangle `lengthMm` x `widthMm` plus a circular-arc front bulging `bowDepthMm` at its centre. */
    | { kind: 'bow-front', lengthMm: number, widthMm: number, bowDepthMm: number, heightMm: number }
  /** Quarter-cylinder for a room corner; `radiusMm` is the length of each straight side. */
    | { kind: 'corner', radiusMm: number, heightMm: number }
  /** Regular hexagonal prism; `sideMm` is one edge of the hexagon. */
    | { kind: 'hexagonal', sideMm: number, heightMm: number }

export type TankShapeKind = TankShape['kind']

/** Dimensions as stored with a tank: which apply depends on the shape. */
export interface TankDimensionsMm {
  lengthMm?: number
  widthMm?: number
  heightMm?: number
  diameterMm?: number
  radiusMm?: number
  sideMm?: number
  bowDepthMm?: number
}

function required(kind: TankShapeKind, name: keyof TankDimensionsMm, dims: TankDimensionsMm): number {
  const value = dims[name]
  if (value === undefined) throw new RangeError(`${name} is required for a ${kind} tank`)
  return value
}

/** Builds a typed shape from a stored shape name and dimensions; throws if one is missing. */
export function tankShapeFrom(kind: TankShapeKind, dims: TankDimensionsMm): TankShape {
  const get = (name: keyof TankDimensionsMm) => required(kind, name, dims)
  switch (kind) {
    case 'rectangular': return { kind, lengthMm: get('lengthMm'), widthMm: get('widthMm'), heightMm: get('heightMm') }
    case 'cube': return { kind, sideMm: get('sideMm') }
    case 'cylinder': return { kind, diameterMm: get('diameterMm'), heightMm: get('heightMm') }
    case 'bow-front': return { kind, lengthMm: get('lengthMm'), widthMm: get('widthMm'), bowDepthMm: get('bowDepthMm'), heightMm: get('heightMm') }
    case 'corner': return { kind, radiusMm: get('radiusMm'), heightMm: get('heightMm') }
    case 'hexagonal': return { kind, sideMm: get('sideMm'), heightMm: get('heightMm') }
  }
}

/** Footprint area (mm^2), perimeter (mm) and height (mm) of a shape. */
export interface ShapeGeometry {
  footprintMm2: number
  perimeterMm: number
  heightMm: number
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
      const { lengthMm: l, widthMm: w, heightMm: h } = shape
      assertPositive('lengthMm', l)
      assertPositive('widthMm', w)
      assertPositive('heightMm', h)
      return { footprintMm2: l * w, perimeterMm: 2 * (l + w), heightMm: h }
    }
    case 'cube': {
      assertPositive('sideMm', shape.sideMm)
      const s = shape.sideMm
      return { footprintMm2: s * s, perimeterMm: 4 * s, heightMm: s }
    }
    case 'cylinder': {
      assertPositive('diameterMm', shape.diameterMm)
      assertPositive('heightMm', shape.heightMm)
      const r = shape.diameterMm / 2
      return { footprintMm2: Math.PI * r * r, perimeterMm: Math.PI * shape.diameterMm, heightMm: shape.heightMm }
    }
    case 'bow-front': {
      const { lengthMm: l, widthMm: w, bowDepthMm: b, heightMm: h } = shape
      assertPositive('lengthMm', l)
      assertPositive('widthMm', w)
      assertPositive('heightMm', h)
      // A bow deeper than half the length would no longer be a single arc over the front.
      assertFinite('bowDepthMm', b, { min: 0, max: l / 2 })
      const segment = circularSegment(l, b)
      return { footprintMm2: l * w + segment.area, perimeterMm: l + 2 * w + segment.arc, heightMm: h }
    }
    case 'corner': {
      assertPositive('radiusMm', shape.radiusMm)
      assertPositive('heightMm', shape.heightMm)
      const r = shape.radiusMm
      return { footprintMm2: (Math.PI * r * r) / 4, perimeterMm: 2 * r + (Math.PI * r) / 2, heightMm: shape.heightMm }
    }
    case 'hexagonal': {
      assertPositive('sideMm', shape.sideMm)
      assertPositive('heightMm', shape.heightMm)
      const s = shape.sideMm
      return { footprintMm2: ((3 * Math.sqrt(3)) / 2) * s * s, perimeterMm: 6 * s, heightMm: shape.heightMm }
    }
  }
}

/** Aragonite mineral density, g/cm3 (reference.md §7). */
export const ARAGONITE_DENSITY_G_CM3 = 2.93
/** Pore fraction of a settled sand bed; 0.40-0.50 is typical (from memory). */
export const DEFAULT_SAND_POROSITY = 0.45

const MM3_PER_L = 1e6

/** What goes in the tank besides water. */
export interface VolumeInput {
  shape: TankShape
  /** Gap between the rim and the water surface, mm (0 = filled to the rim). */
  freeboardMm?: number
  /** Sand bed depth, mm. */
  sandDepthMm?: number
  /** Pore fraction of the sand bed: pore water counts as tank water. */
  sandPorosity?: number
  /** Dry mass of rock, kg. */
  rockKg?: number
  /** Density of the rock's solid mineral, g/cm3; water in the rock's pores counts as tank water. */
  rockDensityGCm3?: number
}

/** Gross and net water volume of a tank. */
export interface VolumeResult {
  footprintM2: number
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
  return (g.footprintMm2 * g.heightMm) / MM3_PER_L
}

/** Water volume gross and net of sand and rock displacement. */
export function tankVolume(input: VolumeInput): VolumeResult {
  const g = shapeGeometry(input.shape)
  const freeboardMm = input.freeboardMm ?? 0
  const sandDepthMm = input.sandDepthMm ?? 0
  const porosity = input.sandPorosity ?? DEFAULT_SAND_POROSITY
  const rockKg = input.rockKg ?? 0
  const rockDensity = input.rockDensityGCm3 ?? ARAGONITE_DENSITY_G_CM3
  assertFinite('freeboardMm', freeboardMm, { min: 0, max: g.heightMm })
  assertFinite('sandDepthMm', sandDepthMm, { min: 0, max: g.heightMm - freeboardMm })
  assertFinite('sandPorosity', porosity, { min: 0, max: 0.9 })
  assertFinite('rockKg', rockKg, { min: 0 })
  assertFinite('rockDensityGCm3', rockDensity, { min: 1, max: 5 })

  const grossL = (g.footprintMm2 * (g.heightMm - freeboardMm)) / MM3_PER_L
  const sandDisplacementL = (g.footprintMm2 * sandDepthMm * (1 - porosity)) / MM3_PER_L
  // kg / (g/cm3) = litres
  const rockDisplacementL = rockKg / rockDensity
  const netL = grossL - sandDisplacementL - rockDisplacementL
  if (netL < 0) throw new RangeError(`rockKg ${rockKg} displaces more than the tank holds (net volume ${netL.toFixed(1)} L)`)
  return { footprintM2: g.footprintMm2 / 1e6, grossL, sandDisplacementL, rockDisplacementL, netL }
}
