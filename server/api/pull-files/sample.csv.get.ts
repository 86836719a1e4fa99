// The sample pull file the import page and the operator's upload page offer: the
// columns and weather lines Pullsheet reads, synthetic (invented) data. Public: the
// dyno operator has no account, and the file holds nothing but the model's numbers.
import { SAMPLE_PULL_FILE_NAME, samplePullCsv } from '#shared/dyno'
import { sendCsvFile } from '~~/server/services/workspace/route'

const text = samplePullCsv()

export default defineEventHandler((event) => {
  setResponseHeader(event, 'cache-control', 'public, max-age=86400')
  return sendCsvFile(event, SAMPLE_PULL_FILE_NAME, text)
})
