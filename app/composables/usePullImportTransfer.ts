// File reading and uploads with progress. $fetch has no upload progress, so the
// requests that carry files go through XMLHttpRequest; a failure rejects with the
// same shape as a $fetch error ({ statusCode, data: body }) so apiMessage,
// apiFieldIssues and apiErrorData read both alike.

export class TransferError extends Error {
  constructor(message: string, readonly statusCode: number | undefined, readonly data: unknown, readonly retryAfter?: number) {
    super(message)
  }
}

export function readFileWithProgress(file: File, onProgress: (fraction: number) => void): Promise<string> {
  return new Promise((resolve, reject) => {
    const reader = new FileReader()
    reader.onprogress = (e) => { if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total) }
    reader.onload = () => { onProgress(1); resolve(String(reader.result ?? '')) }
    reader.onerror = () => reject(new TransferError(`${file.name} could not be read from your disk.`, undefined, undefined))
    // UTF-8 like File.text(): undecodable bytes become U+FFFD, which the server refuses by name.
    reader.readAsText(file, 'utf-8')
  })
}

function parseBody(text: string): unknown {
  try {
    return text ? JSON.parse(text) : undefined
  }
  catch {
    return undefined
  }
}

function send<T>(method: string, url: string, body: string | FormData, onProgress: (fraction: number) => void, json: boolean): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open(method, url)
    xhr.setRequestHeader('Accept', 'application/json')
    if (json) xhr.setRequestHeader('Content-Type', 'application/json')
    xhr.upload.onprogress = (e) => { if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total) }
    xhr.upload.onload = () => onProgress(1)
    xhr.onload = () => {
      const parsed = parseBody(xhr.responseText)
      if (xhr.status >= 200 && xhr.status < 300) return resolve(parsed as T)
      const message = (parsed as { message?: unknown } | undefined)?.message
      const retry = Number(xhr.getResponseHeader('Retry-After'))
      reject(new TransferError(typeof message === 'string' ? message : `The server answered ${xhr.status}.`, xhr.status, parsed, Number.isFinite(retry) && retry > 0 ? retry : undefined))
    }
    xhr.onerror = () => reject(new TransferError('The upload did not reach the server. Check the connection and try again.', undefined, undefined))
    xhr.send(body)
  })
}

export function postJsonWithProgress<T>(url: string, body: unknown, onProgress: (fraction: number) => void): Promise<T> {
  return send<T>('POST', url, JSON.stringify(body), onProgress, true)
}

export function postFormWithProgress<T>(url: string, form: FormData, onProgress: (fraction: number) => void): Promise<T> {
  return send<T>('POST', url, form, onProgress, false)
}
