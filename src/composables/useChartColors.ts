import { computed } from 'vue'
import { usePreferredDark } from '@vueuse/core'
import { readChartColors } from '@/components/progress/chart-colors'

/** The chart colours from the theme variables, read again when the system theme flips. */
export function useChartColors() {
  const dark = usePreferredDark()
  return computed(() => {
    void dark.value
    return readChartColors()
  })
}
