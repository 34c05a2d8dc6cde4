/** The certificate's two faces of Source Sans 3, read once from the bundled server assets. */
import type { CertificateFonts } from './certificate'

let fonts: Promise<CertificateFonts> | undefined

async function fontBytes(weight: 400 | 700): Promise<Uint8Array> {
  const raw = await useStorage('assets:fonts').getItemRaw(`source-sans-3-latin-${weight}-normal.woff`)
  if (!raw) throw createError({ statusCode: 500, statusMessage: 'Certificate font missing from the build' })
  return raw instanceof Uint8Array ? raw : new Uint8Array(raw as ArrayBuffer)
}

export function certificateFonts(): Promise<CertificateFonts> {
  fonts ??= Promise.all([fontBytes(400), fontBytes(700)]).then(([regular, bold]) => ({ regular, bold }))
  fonts.catch(() => {
    fonts = undefined
  })
  return fonts
}
