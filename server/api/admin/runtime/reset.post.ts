export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  resetRuntimeStats()
  return runtimeStats()
})
