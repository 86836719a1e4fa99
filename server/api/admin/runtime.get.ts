// Event-loop stalls and memory of this server process, for the photo benchmark and operators.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  return runtimeStats()
})
