import { z } from '@shared/schemas/zod'
import { request, requestForm } from './client'

/** A form-check video attached to a logged set. */
export const setVideoSchema = z.object({
  id: z.int(),
  setLogId: z.string(),
  mimeType: z.string(),
  sizeBytes: z.int(),
  createdAt: z.string(),
})
export type SetVideo = z.infer<typeof setVideoSchema>

const videoEnvelopeSchema = z.object({ video: setVideoSchema })
const videoUrlSchema = z.object({ url: z.string(), video: setVideoSchema })

/** Uploads a video of one set in the multipart field "video" (the lifter's own set). */
export async function uploadSetVideo(setId: string, file: File): Promise<SetVideo> {
  const form = new FormData()
  form.append('video', file, file.name)
  return (await requestForm('POST', `/sets/${setId}/video`, form, { schema: videoEnvelopeSchema })).video
}

/** A short-lived signed address for a <video> element, which cannot send the bearer token. */
export async function getVideoUrl(uploadId: number): Promise<string> {
  return (await request('GET', `/uploads/${uploadId}/url`, { schema: videoUrlSchema })).url
}

export async function deleteVideo(uploadId: number): Promise<void> {
  await request('DELETE', `/uploads/${uploadId}`)
}
