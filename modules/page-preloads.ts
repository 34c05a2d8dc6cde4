// Lists every lazily imported module (a page, a lazy component) under its own source path in the
// client manifest, so the server names its scripts as modulepreload links in the HTML it sends.
//
// Why: Rollup places modules that a page's lazy parts share (the tank page's plan forms and its
// chart set) in the page's own chunk, which is loaded before them anyway. Such a chunk is then no
// longer the page's facade, Vite's manifest lists it only under its file name, and the server,
// which knows the page it rendered by its source path, found no scripts for it. The tank page's
// 35 scripts came only as low-priority prefetch links and were fetched again, one import after
// another, once the entry had run: 130-400 ms before hydration could start (bench/README.md).
import { basename, relative } from 'node:path'
import { addVitePlugin, defineNuxtModule } from 'nuxt/kit'

export default defineNuxtModule({
  meta: { name: 'tidewright-page-preloads' },
  setup(_options, nuxt) {
    /** Source path (as the manifest keys it) of a lazily imported module -> the key of the chunk that holds it. */
    const heldIn = new Map<string, string>()
    addVitePlugin({
      name: 'tidewright:page-preloads',
      generateBundle(_outputOptions, bundle) {
        for (const chunk of Object.values(bundle)) {
          if (chunk.type !== 'chunk' || !chunk.isDynamicEntry || chunk.facadeModuleId) continue
          for (const id of chunk.moduleIds) {
            if (this.getModuleInfo(id)?.dynamicImporters.length) heldIn.set(relative(nuxt.options.srcDir, id), `_${basename(chunk.fileName)}`)
          }
        }
      },
    }, { server: false, dev: false })
    nuxt.hook('build:manifest', (manifest) => {
      for (const [source, chunkKey] of heldIn) {
        if (!manifest[source] && manifest[chunkKey]) manifest[source] = manifest[chunkKey]
      }
    })
  },
})
