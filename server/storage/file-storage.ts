import type { Readable } from 'node:stream';

/** An object's bytes with the headers it is served with. */
export interface StoredObject {
  body: Buffer;
  contentType: string | null;
  contentDisposition: string | null;
}

/** Where figures and attachments live. The app depends only on this interface. */
export interface FileStorage {
  put(key: string, body: Buffer | Uint8Array | string, contentType: string): Promise<void>;
  /** Stores a stream of known length without buffering it; `contentDisposition` is served with downloads. */
  putStream(key: string, body: Readable, props: { contentType: string; byteLength: number; contentDisposition?: string }): Promise<void>;
  /** The object's bytes, or null when there is none under `key`. */
  get(key: string): Promise<Buffer | null>;
  /** The object's bytes and headers (for backups), or null when there is none under `key`. */
  read(key: string): Promise<StoredObject | null>;
  delete(key: string): Promise<void>;
  /** Every object whose key starts with `prefix`, with when it was last written. */
  list(prefix: string): AsyncIterable<{ key: string; lastModified: Date }>;
  /** A time-limited URL to read the object directly. */
  signedUrl(key: string, expiresInSeconds?: number): Promise<string>;
  /** Throws when the bucket cannot be reached (for the health check). */
  check(): Promise<void>;
}
