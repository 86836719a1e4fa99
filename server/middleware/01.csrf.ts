export default defineEventHandler((event) => {
  if (!event.path.startsWith('/api/')) return
  const reason = csrfRejection(event)
  if (reason) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: reason })
})
