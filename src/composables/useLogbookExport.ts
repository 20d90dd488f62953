import { ref } from 'vue'
import { downloadLogbook, type LogbookFormat } from '@/api/logbook'

/** Hands a file to the browser's download: an object URL clicked through a temporary link. */
function saveFile(blob: Blob, filename: string) {
  const url = URL.createObjectURL(blob)
  const link = document.createElement('a')
  link.href = url
  link.download = filename
  link.style.display = 'none'
  document.body.append(link)
  link.click()
  link.remove()
  // Some browsers read the URL after click() returns: free it on the next turn.
  setTimeout(() => URL.revokeObjectURL(url), 0)
}

/**
 * The logbook as a CSV or JSON file (the lifter's own, or a coach's athlete's). The API wants
 * the bearer token, so the file is fetched here and saved from memory instead of opened by a
 * plain link.
 */
export function useLogbookExport(athleteId?: number) {
  const exporting = ref<LogbookFormat | null>(null)

  async function exportLogbook(format: LogbookFormat): Promise<void> {
    exporting.value = format
    try {
      const { blob, filename } = await downloadLogbook(format, athleteId)
      saveFile(blob, filename ?? `chalkline-logbook.${format}`)
    } finally {
      exporting.value = null
    }
  }

  return { exporting, exportLogbook }
}
