export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, PullParams)
  return { pull: await getPullDetail(useDb(), params.id, params.pullId) }
})
