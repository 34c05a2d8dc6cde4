/** ANY /api/** — an API path no route declares. Always 404 JSON, never the sign-in page. */
export default defineEventHandler(() => {
  throw createError({ statusCode: 404, statusMessage: 'No such API route' })
})
