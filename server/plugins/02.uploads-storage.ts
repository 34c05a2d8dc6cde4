import fsDriver from 'unstorage/drivers/fs'
import s3Driver from 'unstorage/drivers/s3'

/**
 * Mounts the `uploads` storage from runtime config, so one build serves any deployment:
 * the fs driver under NUXT_UPLOADS_DIR by default, or S3-compatible object storage when
 * NUXT_UPLOADS_DRIVER=s3 (NUXT_UPLOADS_S3_ENDPOINT, _BUCKET, _REGION, _ACCESS_KEY_ID,
 * _SECRET_ACCESS_KEY). Credentials come from the environment, never from the build.
 */
export default defineNitroPlugin(() => {
  const config = useRuntimeConfig()
  const storage = useStorage()
  const mount = storage.getMount('uploads:')
  // Synchronous on purpose (Nitro does not await plugins): without dispose, unmount removes the
  // mount before its promise is returned, so no request can see the storage unmounted.
  if (mount.base === 'uploads:') void storage.unmount('uploads', false)
  if (config.uploadsDriver === 's3') {
    const s3 = config.uploadsS3
    for (const [name, value] of Object.entries(s3)) {
      if (!value) {
        console.error(`Tidewright cannot start: NUXT_UPLOADS_DRIVER=s3 needs NUXT_UPLOADS_S3_${name.replace(/[A-Z]/g, c => `_${c}`).toUpperCase()}.`)
        process.exit(1)
      }
    }
    storage.mount('uploads', s3Driver({ ...s3 }))
  }
  else {
    storage.mount('uploads', fsDriver({ base: config.uploadsDir }))
  }
})
