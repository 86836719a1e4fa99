import type { H3Event } from 'h3'

/** A file the browser saves under this name (never shown inline: an SVG opened on our origin could run script). */
export function sendDownload(event: H3Event, file: { body: Buffer | string, contentType: string, fileName: string }): Buffer | string {
  setResponseHeaders(event, {
    'content-type': file.contentType,
    'content-disposition': `attachment; filename="${file.fileName.replace(/["\\\r\n]/g, '_')}"; filename*=UTF-8''${encodeURIComponent(file.fileName)}`,
    'x-content-type-options': 'nosniff',
  })
  return file.body
}
