// Bytes on their way to or from a worker thread through a MessagePort's queue: each
// piece is moved (its ArrayBuffer transferred), so the sending thread keeps nothing of
// it, not even for its garbage collector to find, and the receiving thread takes the
// queued pieces at once with receiveMessageOnPort (they wait in the port, outside
// either thread's heap, until then). Plain Node: the pull-check worker imports it too.
import { receiveMessageOnPort, type MessagePort } from 'node:worker_threads'

/**
 * Posts `bytes` into the port's queue and leaves the caller's view empty (detached).
 * A view that owns its whole ArrayBuffer (Node's HTTP parser gives every body chunk one
 * of its own) is moved as it is; a view into a larger buffer (a multipart part) is
 * copied first, so nothing else on that buffer is taken away.
 */
export function moveToPort(port: MessagePort, bytes: Uint8Array): void {
  const whole = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength && bytes.buffer instanceof ArrayBuffer
  if (whole) {
    try {
      port.postMessage(bytes, [bytes.buffer as ArrayBuffer])
      return
    }
    catch { /* an untransferable buffer (Node's Buffer pool): copied below */ }
  }
  const copy = new Uint8Array(bytes)
  port.postMessage(copy, [copy.buffer])
}

/** Every piece waiting in the port, in the order it was posted; the port is closed unless it is to answer. */
export function takeFromPort(port: MessagePort, { keepOpen = false } = {}): Uint8Array[] {
  const pieces: Uint8Array[] = []
  for (let m = receiveMessageOnPort(port); m; m = receiveMessageOnPort(port)) pieces.push(m.message as Uint8Array)
  if (!keepOpen) port.close()
  return pieces
}
