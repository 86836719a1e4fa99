export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  return getBenchTestDetail(useDb(), user, params.id)
})
