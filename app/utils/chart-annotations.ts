/**
 * What the charts draw around the data, as chartjs-plugin-annotation options: phase spans,
 * threshold bands and lines, and event markers, each kind of event with its own shape so
 * no two read alike. Labels are placed so they stay readable on a 375 px phone: threshold
 * labels sit above their line at its right end, phase names show only where their span is
 * wide enough, and markers that fall close together alternate between two rows instead of covering each other.
 */
import type { PointStyle } from 'chart.js'
import type { AnnotationOptions, PartialEventContext } from 'chartjs-plugin-annotation'
import type { CycleEventKind } from '#shared/vocabulary'
import { CHART_INK } from './chart-palette'

export interface ChartSpan { from: number, to: number, color: string, label?: string }
export interface ChartBand { from: number, to: number, color: string, axis?: string }
export interface ChartLine { y: number, color: string, label: string, short?: string, axis?: string }
export interface ChartMarker { x: number, kind: CycleEventKind }

/** One shape per kind of event; the legend under each chart names them (EventMarkerLegend). */
export const EVENT_MARKER_SHAPES: Readonly<Record<CycleEventKind, PointStyle>> = Object.freeze({
  'ammonia-dose': 'triangle',
  'bacteria-dose': 'circle',
  'water-change': 'rectRot',
  'livestock-added': 'star',
  'lighting-change': 'rect',
  'note': 'crossRot',
})

const FONT = { family: '"Source Sans 3", system-ui, sans-serif', size: 11 }
const MARKER_RADIUS = 5
/** Below this chart width (px) a threshold line shows its short label. */
const NARROW = 480

const plotWidth = (ctx: PartialEventContext) => ctx.chart.chartArea?.width ?? ctx.chart.width

/** Cycle phases as shaded spans across the plot, named at their top left where they are wide enough. */
export function spanAnnotations(spans: ChartSpan[]): AnnotationOptions[] {
  return spans.filter(s => s.to > s.from).map(span => ({
    type: 'box',
    drawTime: 'beforeDatasetsDraw',
    xMin: span.from,
    xMax: span.to,
    backgroundColor: span.color,
    borderWidth: 0,
    adjustScaleRange: false,
    label: {
      display: (ctx: PartialEventContext) => {
        if (!span.label) return false
        const x = ctx.chart.scales.x
        return !!x && x.getPixelForValue(span.to) - x.getPixelForValue(span.from) > span.label.length * 6 + 10
      },
      content: span.label ?? '',
      position: { x: 'start', y: 'end' },
      // A light backdrop keeps the name readable where a series runs along zero.
      backgroundColor: 'rgba(255,255,255,0.75)',
      color: CHART_INK.text,
      font: FONT,
      padding: 3,
    },
  }))
}

/** Horizontal bands between two values (what reads as zero, the salinity range). */
export function bandAnnotations(bands: ChartBand[]): AnnotationOptions[] {
  return bands.filter(b => b.to > b.from).map(band => ({
    type: 'box',
    drawTime: 'beforeDatasetsDraw',
    yScaleID: band.axis ?? 'y',
    yMin: band.from,
    yMax: band.to,
    backgroundColor: band.color,
    borderWidth: 0,
    adjustScaleRange: false,
  }))
}

/** Dashed threshold lines, labelled just above the line at its right end (a short label on a phone). */
export function lineAnnotations(lines: ChartLine[]): AnnotationOptions[] {
  return lines.map(line => ({
    type: 'line',
    drawTime: 'afterDatasetsDraw',
    scaleID: line.axis ?? 'y',
    value: line.y,
    borderColor: line.color,
    borderWidth: 1.5,
    borderDash: [6, 4],
    label: {
      display: true,
      content: (ctx: PartialEventContext) => (plotWidth(ctx) < NARROW ? (line.short ?? line.label) : line.label),
      position: 'end',
      // Above the line, or below it where the line runs too close to the top to leave room.
      yAdjust: (ctx: PartialEventContext) => {
        const y = ctx.chart.scales[line.axis ?? 'y']
        const top = ctx.chart.chartArea?.top ?? 0
        return y && y.getPixelForValue(line.y) - top < 18 ? 10 : -10
      },
      backgroundColor: 'rgba(255,255,255,0.85)',
      color: line.color,
      font: { ...FONT, weight: 'bold' },
      padding: { x: 3, y: 1 },
      borderRadius: 2,
    },
  }))
}

/**
 * Event markers: a thin vertical line and the event's shape along the top of the plot.
 * A marker closer than about two shapes' width to the one before drops to a second row.
 */
export function markerAnnotations(markers: ChartMarker[], axis = 'y'): AnnotationOptions[] {
  const sorted = [...markers].sort((a, b) => a.x - b.x)
  const row: number[] = []
  return sorted.flatMap((marker, i) => {
    const line: AnnotationOptions = {
      type: 'line',
      drawTime: 'beforeDatasetsDraw',
      scaleID: 'x',
      value: marker.x,
      borderColor: CHART_INK.text,
      borderWidth: 1,
      borderDash: [2, 3],
    }
    const point: AnnotationOptions = {
      type: 'point',
      drawTime: 'afterDatasetsDraw',
      xValue: marker.x,
      yScaleID: axis,
      yValue: (ctx: PartialEventContext) => ctx.chart.scales[axis]?.max ?? 0,
      adjustScaleRange: false,
      pointStyle: EVENT_MARKER_SHAPES[marker.kind],
      radius: MARKER_RADIUS,
      backgroundColor: CHART_INK.text,
      borderColor: CHART_INK.text,
      borderWidth: 1.5,
      yAdjust: (ctx: PartialEventContext) => {
        const x = ctx.chart.scales.x
        if (!x) return MARKER_RADIUS + 2
        // Count how many earlier markers sit within two shapes of this one: that is its row.
        const px = x.getPixelForValue(marker.x)
        const prev = i > 0 ? x.getPixelForValue(sorted[i - 1]!.x) : -Infinity
        // Two rows are enough: a run of daily doses on a phone alternates instead of climbing down the plot.
        row[i] = px - prev < MARKER_RADIUS * 2.4 ? ((row[i - 1] ?? 0) + 1) % 2 : 0
        return MARKER_RADIUS + 2 + row[i]! * (MARKER_RADIUS * 2 + 3)
      },
    }
    return [line, point]
  })
}
