import { ref } from 'vue'
import { ApiError } from '@/api/client'
import { deleteVideo, getVideoUrl, uploadSetVideo } from '@/api/uploads'

/** What went wrong with an upload, in the lifter's words. */
function videoUploadMessage(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 415 || error.code === 'not_a_video') return 'That file is not a video. Choose a video from the camera or the gallery.'
    if (error.status === 413 || error.code === 'file_too_large') return 'That video is too large. Film just the set (a short clip) and try again.'
    if (error.status === 0) return error.message
    return error.message || 'Could not upload the video.'
  }
  return 'Could not upload the video.'
}

/**
 * Form-check videos on the sets of one session: upload (one at a time per set), play through a
 * short-lived signed address, delete. `videoIds` holds the changes made here over the loaded
 * session (set id -> video id, or null once deleted).
 */
export function useSetVideo() {
  const videoIds = ref<Record<string, number | null>>({})
  const uploading = ref<Record<string, boolean>>({})
  const messages = ref<Record<string, string>>({})
  const playerUrl = ref<string | null>(null)
  const playerOpen = ref(false)
  const opening = ref<number | null>(null)

  async function upload(setId: string, file: File): Promise<void> {
    uploading.value = { ...uploading.value, [setId]: true }
    const { [setId]: _old, ...rest } = messages.value
    messages.value = rest
    try {
      const video = await uploadSetVideo(setId, file)
      videoIds.value = { ...videoIds.value, [setId]: video.id }
    } catch (e) {
      messages.value = { ...messages.value, [setId]: videoUploadMessage(e) }
    } finally {
      uploading.value = { ...uploading.value, [setId]: false }
    }
  }

  async function play(videoId: number): Promise<void> {
    opening.value = videoId
    try {
      playerUrl.value = await getVideoUrl(videoId)
      playerOpen.value = true
    } finally {
      opening.value = null
    }
  }

  async function remove(setId: string, videoId: number): Promise<void> {
    await deleteVideo(videoId)
    videoIds.value = { ...videoIds.value, [setId]: null }
  }

  function closePlayer() {
    playerOpen.value = false
    playerUrl.value = null
  }

  return { videoIds, uploading, messages, playerUrl, playerOpen, opening, upload, play, remove, closePlayer }
}
