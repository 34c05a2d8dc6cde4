// npm start — serves the built app (.output); PORT is honoured by Nitro itself.
import { existsSync } from 'node:fs'

if (!existsSync('.output/server/index.mjs')) {
  console.error('Tidewright is not built yet: run `npm run build` first (or `npm run demo`).')
  process.exit(1)
}
await import('../.output/server/index.mjs')
