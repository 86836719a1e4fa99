export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, SetupParams)
  return { setups: await makeBaseline(useDb(), params.id, params.setupId) }
})
