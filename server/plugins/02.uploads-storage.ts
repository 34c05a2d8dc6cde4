import fsDriver from 'unstorage/drivers/fs'

/**
 * Points the `uploads` storage at the directory from runtime config (NUXT_UPLOADS_DIR),
 * so one build can run with different data directories. Only the fs driver is re-pointed:
 * a deployment that mounts another driver (see DEVELOPERS.md, "Uploads": unstorage's s3
 * driver from runtime config) keeps it.
 */
export default defineNitroPlugin(() => {
  const dir = useRuntimeConfig().uploadsDir
  const storage = useStorage()
  const mount = storage.getMount('uploads:')
  if (mount.base !== 'uploads:' || mount.driver.name === 'fs') {
    // Synchronous on purpose (Nitro does not await plugins): without dispose, unmount removes the
    // mount before its promise is returned, so no request can see the storage unmounted.
    if (mount.base === 'uploads:') void storage.unmount('uploads', false)
    storage.mount('uploads', fsDriver({ base: dir }))
  }
})
