/** The calculators' tank shape, shared with the server's commissioning checks. */
export { tankShapeOf } from '#shared/calc/tank-shape'
