/** Anything that yields the bytes of a CSV file: a Node readable stream, a web ReadableStream, or an async iterable of chunks. */
export type ByteSource = AsyncIterable<Uint8Array | string> | ReadableStream<Uint8Array>;

/**
 * The chunks of a {@link ByteSource}, one at a time. A web ReadableStream is read through its reader (not every
 * runtime makes it async-iterable) and its lock is released when the loop ends or stops early.
 */
export async function* byteSourceChunks(source: ByteSource): AsyncGenerator<Uint8Array | string> {
  if (typeof (source as ReadableStream<Uint8Array>).getReader === 'function') {
    const reader = (source as ReadableStream<Uint8Array>).getReader();
    try {
      for (;;) {
        const { done, value } = await reader.read();
        if (done) return;
        yield value;
      }
    } finally {
      reader.releaseLock();
    }
  }
  yield* source as AsyncIterable<Uint8Array | string>;
}

/** The bytes of a Blob, `chunkBytes` at a time (each slice is read only when needed, so memory stays flat). */
export async function* blobChunks(blob: Blob, chunkBytes: number): AsyncGenerator<Uint8Array> {
  for (let offset = 0; offset < blob.size; offset += chunkBytes) {
    yield new Uint8Array(await blob.slice(offset, offset + chunkBytes).arrayBuffer());
  }
}
