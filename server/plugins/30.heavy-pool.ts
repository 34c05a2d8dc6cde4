/** Starts the heavy-work pool's thread with the server, so the first CSV import does not wait for it (server/utils/heavy-work.ts). */
export default defineNitroPlugin(() => {
  // After the entry module has run: the pool finds its worker file from the server's own path, known only then.
  setImmediate(() => {
    try {
      warmHeavyPool()
    }
    catch (error) {
      // The first task that needs the pool reports the same problem to its caller.
      console.error('Tidewright heavy-work pool:', error instanceof Error ? error.message : error)
    }
  })
})
