export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  return { links: await listOperatorLinks(useDb(), params.id) }
})
