/** Public entry of the nitrification simulator: plans, kits and the model. */
export * from './kits'
export * from './model'
export * from './simulate'
export * from './plans'
