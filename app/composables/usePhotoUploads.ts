import { PHOTO_ACCEPTED_TEXT, PHOTO_MAX_BYTES, type PhotoUploadResult } from '#shared/types/photos'

export type PhotoUploadState = 'waiting' | 'uploading' | 'stored' | 'duplicate' | 'refused'

export interface PhotoUploadItem {
  key: number
  name: string
  size: number
  /** 0-100, from the browser's upload progress events. */
  progress: number
  state: PhotoUploadState
  message: string
  /** The stored photo, so the list can follow its web sizes being made. */
  photoId: number | null
}

const AT_ONCE = 2

interface XhrAnswer { status: number, body: Partial<PhotoUploadResult> & { message?: string } }

/** XMLHttpRequest because fetch() reports no upload progress. */
function send(url: string, file: File, onProgress: (percent: number) => void): Promise<XhrAnswer> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest()
    xhr.open('POST', url)
    xhr.setRequestHeader('Accept', 'application/json')
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(Math.round((e.loaded / e.total) * 100))
    }
    xhr.onload = () => {
      let body: XhrAnswer['body'] = {}
      try { body = JSON.parse(xhr.responseText) }
      catch { /* not JSON: the status says enough */ }
      resolve({ status: xhr.status, body })
    }
    xhr.onerror = () => resolve({ status: 0, body: { message: 'The connection broke off. Check the network and add the photo again.' } })
    const form = new FormData()
    form.append('file', file, file.name)
    xhr.send(form)
  })
}

/**
 * Uploads chosen photos, two at a time, one request each, with a progress bar
 * per file. The server decides what a file is; the only check here is the size,
 * so nobody waits for 200 MB to travel just to be refused.
 */
export function usePhotoUploads(benchTestId: MaybeRefOrGetter<number>, onStored: () => void) {
  const items = ref<PhotoUploadItem[]>([])
  const queue: { item: PhotoUploadItem, file: File }[] = []
  let active = 0
  let nextKey = 1

  function pump() {
    while (active < AT_ONCE && queue.length) {
      const { item, file } = queue.shift()!
      active++
      void upload(item, file).finally(() => {
        active--
        pump()
      })
    }
  }

  async function upload(item: PhotoUploadItem, file: File) {
    item.state = 'uploading'
    const answer = await send(`/api/bench-tests/${toValue(benchTestId)}/photos`, file, (p) => { item.progress = p })
    if (answer.status === 201 || answer.status === 200) {
      item.progress = 100
      item.state = answer.body.duplicate ? 'duplicate' : 'stored'
      item.photoId = answer.body.photo?.id ?? null
      item.message = answer.body.duplicate ? 'Already in this bench test: the photo there is kept.' : 'Stored. The web sizes are being made.'
      onStored()
    }
    else {
      item.state = 'refused'
      item.message = answer.body.message ?? 'The upload did not work. Try again in a moment.'
    }
  }

  function add(files: Iterable<File>) {
    for (const file of files) {
      const item = reactive<PhotoUploadItem>({ key: nextKey++, name: file.name, size: file.size, progress: 0, state: 'waiting', message: '', photoId: null })
      items.value.push(item)
      if (file.size > PHOTO_MAX_BYTES) {
        item.state = 'refused'
        item.message = `The file is larger than 40 MB. ${PHOTO_ACCEPTED_TEXT}`
        continue
      }
      queue.push({ item, file })
    }
    pump()
  }

  function clearFinished() {
    items.value = items.value.filter(i => i.state === 'waiting' || i.state === 'uploading')
  }

  const busy = computed(() => items.value.some(i => i.state === 'waiting' || i.state === 'uploading'))

  return { items, add, clearFinished, busy }
}
