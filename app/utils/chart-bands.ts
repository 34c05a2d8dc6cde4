/**
 * A small Chart.js plugin of Tidewright's own: shaded vertical spans (cycle phases),
 * horizontal bands and lines (thresholds) and event markers, drawn under the data.
 * Nothing is loaded from anywhere else.
 */
import type { Chart, Plugin } from 'chart.js'

export interface ChartSpan { from: number, to: number, color: string, label?: string }
export interface ChartBand { from: number, to: number, color: string, axis?: string }
export interface ChartLine { y: number, color: string, label: string, axis?: string }
export interface ChartMarker { x: number, color: string, label: string }

export interface BandsOptions {
  spans?: ChartSpan[]
  bands?: ChartBand[]
  lines?: ChartLine[]
  markers?: ChartMarker[]
}

function draw(chart: Chart, options: BandsOptions) {
  const { ctx, chartArea: area, scales } = chart
  const x = scales.x
  if (!x || !area) return
  const clampX = (px: number) => Math.min(area.right, Math.max(area.left, px))
  ctx.save()
  for (const span of options.spans ?? []) {
    const left = clampX(x.getPixelForValue(span.from))
    const right = clampX(x.getPixelForValue(span.to))
    if (right <= left) continue
    ctx.fillStyle = span.color
    ctx.fillRect(left, area.top, right - left, area.bottom - area.top)
    if (span.label && right - left > 40) {
      ctx.fillStyle = '#6b8189'
      ctx.font = '11px "Source Sans 3", system-ui, sans-serif'
      ctx.fillText(span.label, left + 4, area.bottom - 4)
    }
  }
  for (const band of options.bands ?? []) {
    const y = scales[band.axis ?? 'y']
    if (!y) continue
    const top = Math.max(area.top, Math.min(area.bottom, y.getPixelForValue(band.to)))
    const bottom = Math.max(area.top, Math.min(area.bottom, y.getPixelForValue(band.from)))
    if (bottom <= top) continue
    ctx.fillStyle = band.color
    ctx.fillRect(area.left, top, area.right - area.left, bottom - top)
  }
  ctx.font = '11px "Source Sans 3", system-ui, sans-serif'
  for (const line of options.lines ?? []) {
    const y = scales[line.axis ?? 'y']
    if (!y) continue
    const py = y.getPixelForValue(line.y)
    if (py < area.top || py > area.bottom) continue
    ctx.strokeStyle = line.color
    ctx.setLineDash([6, 4])
    ctx.lineWidth = 1.5
    ctx.beginPath()
    ctx.moveTo(area.left, py)
    ctx.lineTo(area.right, py)
    ctx.stroke()
    ctx.setLineDash([])
    ctx.fillStyle = line.color
    ctx.fillText(line.label, area.left + 4, py - 3)
  }
  for (const marker of options.markers ?? []) {
    const px = x.getPixelForValue(marker.x)
    if (px < area.left || px > area.right) continue
    ctx.strokeStyle = marker.color
    ctx.lineWidth = 1
    ctx.beginPath()
    ctx.moveTo(px, area.top)
    ctx.lineTo(px, area.bottom)
    ctx.stroke()
    ctx.fillStyle = marker.color
    ctx.beginPath()
    ctx.moveTo(px - 5, area.top)
    ctx.lineTo(px + 5, area.top)
    ctx.lineTo(px, area.top + 7)
    ctx.fill()
    ctx.fillText(marker.label, Math.min(px + 3, area.right - 12), area.top + 16)
  }
  ctx.restore()
}

export const bandsPlugin: Plugin<'line'> = {
  id: 'twBands',
  beforeDatasetsDraw(chart, _args, options) {
    draw(chart as unknown as Chart, options as BandsOptions)
  },
}
