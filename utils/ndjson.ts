/**
 * Reads a newline-delimited JSON response as it arrives and hands each parsed line to `onLine`.
 * A line can be split across chunks, so the unfinished tail waits for the next one.
 */
export async function readNdjson<T>(body: ReadableStream<Uint8Array>, onLine: (line: T) => void): Promise<void> {
  const reader = body.getReader()
  const decoder = new TextDecoder()
  let buffer = ''
  for (;;) {
    const { value, done } = await reader.read()
    buffer += decoder.decode(value, { stream: !done })
    let nl = buffer.indexOf('\n')
    while (nl >= 0) {
      const line = buffer.slice(0, nl).trim()
      buffer = buffer.slice(nl + 1)
      if (line) onLine(JSON.parse(line) as T)
      nl = buffer.indexOf('\n')
    }
    if (done) break
  }
  if (buffer.trim()) onLine(JSON.parse(buffer) as T)
}
