import type { StatusShape } from '~/utils/status-looks'

/** One SVG element of a status mark, drawn in a 10 by 10 box in the text's own colour. */
export interface StatusMarkPart {
  tag: 'circle' | 'path' | 'rect'
  attrs: Record<string, string>
}

// A ring is the outline every hollow shape starts from (the half shape fills one side of it).
const RING: StatusMarkPart = {
  tag: 'circle',
  attrs: { 'cx': '5', 'cy': '5', 'r': '3.6', 'fill': 'none', 'stroke': 'currentColor', 'stroke-width': '1.6' },
}

/**
 * What `<StatusPill>` draws for each shape: one home for the marks, so adding a shape is one
 * row here and no two statuses can end up drawn alike by a copied branch.
 */
export const STATUS_MARKS: Record<StatusShape, readonly StatusMarkPart[]> = {
  ring: [RING],
  half: [RING, { tag: 'path', attrs: { d: 'M5 1.4 A3.6 3.6 0 0 1 5 8.6 Z', fill: 'currentColor' } }],
  square: [{ tag: 'rect', attrs: { x: '1.5', y: '1.5', width: '7', height: '7', fill: 'currentColor' } }],
  diamond: [{ tag: 'path', attrs: { d: 'M5 0.5 L9.5 5 L5 9.5 L0.5 5 Z', fill: 'currentColor' } }],
  check: [{ tag: 'path', attrs: { 'd': 'M1.2 5.4 L4 8.2 L8.8 1.8', 'fill': 'none', 'stroke': 'currentColor', 'stroke-width': '1.9' } }],
  dot: [{ tag: 'circle', attrs: { cx: '5', cy: '5', r: '4', fill: 'currentColor' } }],
  triangle: [{ tag: 'path', attrs: { d: 'M5 0.8 L9.6 9.2 L0.4 9.2 Z', fill: 'currentColor' } }],
  cross: [{ tag: 'path', attrs: { 'd': 'M1.8 1.8 L8.2 8.2 M8.2 1.8 L1.8 8.2', 'stroke': 'currentColor', 'stroke-width': '1.9' } }],
  dash: [{ tag: 'path', attrs: { 'd': 'M1.2 5 L8.8 5', 'stroke': 'currentColor', 'stroke-width': '2' } }],
}
