import { createReadStream, existsSync } from 'node:fs'
import { mkdir, rename, rm, stat } from 'node:fs/promises'
import { dirname, join } from 'node:path'
import type { Readable } from 'node:stream'

/**
 * Where form-check videos live. Local disk is the default; a hosted object store can take its
 * place by implementing the same four calls through that service's own SDK.
 */
export interface UploadStorage {
  /** Moves a finished temporary file into storage under `key`. */
  put(key: string, tempFile: string): Promise<void>
  size(key: string): Promise<number>
  /** A stream of the bytes from `start` to `end` inclusive (or the whole file). */
  read(key: string, range?: { start: number; end: number }): Readable
  remove(key: string): Promise<void>
}

export class LocalDiskStorage implements UploadStorage {
  constructor(private readonly root: string) {}

  private path(key: string) {
    // Keys are made by the server (random UUIDs); refuse anything that could climb out of root.
    if (!/^[a-f0-9-]{36}\.(mp4|webm|mov)$/.test(key)) throw new Error(`Bad storage key: ${key}`)
    return join(this.root, key.slice(0, 2), key)
  }

  async put(key: string, tempFile: string) {
    const target = this.path(key)
    await mkdir(dirname(target), { recursive: true })
    await rename(tempFile, target)
  }

  async size(key: string) {
    return (await stat(this.path(key))).size
  }

  read(key: string, range?: { start: number; end: number }) {
    return createReadStream(this.path(key), range)
  }

  async remove(key: string) {
    const target = this.path(key)
    if (existsSync(target)) await rm(target)
  }
}
