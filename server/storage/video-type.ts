import { open } from 'node:fs/promises'

export type VideoType = { mime: 'video/mp4' | 'video/webm' | 'video/quicktime'; ext: 'mp4' | 'webm' | 'mov' }

/**
 * The video type from the file's first bytes, never from its name: ISO base media files
 * (MP4, QuickTime) carry "ftyp" at offset 4 (ISO/IEC 14496-12), WebM/Matroska files start with
 * the EBML magic 1A 45 DF A3 (RFC 8794). Anything else is refused.
 */
export async function sniffVideoType(file: string): Promise<VideoType | null> {
  const handle = await open(file, 'r')
  try {
    const head = Buffer.alloc(12)
    const { bytesRead } = await handle.read(head, 0, 12, 0)
    if (bytesRead >= 12 && head.toString('latin1', 4, 8) === 'ftyp') {
      const brand = head.toString('latin1', 8, 12)
      return brand === 'qt  ' ? { mime: 'video/quicktime', ext: 'mov' } : { mime: 'video/mp4', ext: 'mp4' }
    }
    if (bytesRead >= 4 && head.readUInt32BE(0) === 0x1a45dfa3) return { mime: 'video/webm', ext: 'webm' }
    return null
  } finally {
    await handle.close()
  }
}
