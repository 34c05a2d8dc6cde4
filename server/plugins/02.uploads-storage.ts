import fsDriver from 'unstorage/drivers/fs'

/**
 * Points the `uploads` storage at the directory from runtime config (NUXT_UPLOADS_DIR),
 * so one build can run with different data directories. Only the fs driver is re-pointed:
 * a deployment that configures another driver in nuxt.config (`nitro.storage.uploads`,
 * e.g. unstorage's s3 driver) keeps it as configured.
 */
export default defineNitroPlugin(async () => {
  const dir = useRuntimeConfig().uploadsDir
  const storage = useStorage()
  const mount = storage.getMount('uploads:')
  if (mount.base !== 'uploads:' || mount.driver.name === 'fs') {
    if (mount.base === 'uploads:') await storage.unmount('uploads', false)
    storage.mount('uploads', fsDriver({ base: dir }))
  }
})
