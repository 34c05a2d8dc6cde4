/**
 * GET /tanks/edit/:id — the tank editor's former address; bookmarks and old links land on
 * /tanks/:id/edit. Answers a permanent redirect.
 */
export default defineEventHandler((event) => {
  const id = encodeURIComponent(getRouterParam(event, 'id') ?? '')
  return sendRedirect(event, `/tanks/${id}/edit`, 301)
})
