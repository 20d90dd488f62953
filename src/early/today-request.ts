import { savedToday } from '../offline/saved-today'
import { TOKEN_STORAGE_KEY, USER_STORAGE_KEY } from '../stores/storage-keys'
import { localDay } from '../utils/dates'

/**
 * Today's plan request, sent by a small script inlined in index.html (src/early/page-script.ts)
 * while the page still downloads the app, instead of after the app has loaded and started.
 * On a slow phone network the app's JavaScript takes most of a second to arrive: the request
 * now travels during that time, and the Train screen finds the answer waiting
 * (src/api/train.ts `startEarlyToday` adopts it and reads it as any other answer).
 *
 * Relative imports only and nothing from Vue or Pinia: this file is bundled on its own into
 * the page (build/inline-early-script.ts), so it must stay a few hundred bytes.
 */

/** Where the page leaves its request for the app. */
export const PAGE_TODAY_REQUEST = '__chalklinePageTodayRequest'

export interface PageTodayRequest {
  date: string
  tzOffset: number
  /** Date.now() when it was sent. */
  startedAt: number
  sent: Promise<Response>
}

/**
 * The paths the app opens on Train: the router's 'home' (which redirects to Train) and 'train'.
 * tests/client/early-today.test.ts checks them against the router's own `opensOnTrain`.
 */
export const TRAIN_PATHS: readonly string[] = ['/', '/train']

/**
 * Sends today's request when a lifter kept on the phone opens the app on Train and the phone
 * has not kept today's plan already (Train paints that at once and refreshes it itself).
 * The same conditions as src/main.ts, read straight from localStorage.
 */
export function sendPageTodayRequest(path: string, now: Date = new Date()): PageTodayRequest | null {
  try {
    const trimmed = path.length > 1 ? path.replace(/\/+$/, '') : path
    if (!TRAIN_PATHS.includes(trimmed)) return null
    const token = localStorage.getItem(TOKEN_STORAGE_KEY)
    const user = JSON.parse(localStorage.getItem(USER_STORAGE_KEY) ?? 'null') as { id?: unknown; role?: unknown } | null
    if (!token || !user || user.role !== 'lifter' || typeof user.id !== 'number') return null
    const day = localDay(now)
    if (savedToday(user.id, day)) return null
    // The same address and headers as the API client's own GET /train/today (src/api/train.ts).
    const query = new URLSearchParams({ date: day.date, tzOffset: String(day.tzOffset) })
    const sent = fetch(`/api/train/today?${query.toString()}`, {
      headers: { Accept: 'application/json', Authorization: `Bearer ${token}` },
    })
    // The app may never take it (it failed to load, or the screen changed).
    sent.catch(() => {})
    return { date: day.date, tzOffset: day.tzOffset, startedAt: now.getTime(), sent }
  } catch {
    // Storage blocked or a damaged entry: the app sends its own request as before.
    return null
  }
}

/** The page's request, once: the app takes it at start-up and nothing else may. */
export function takePageTodayRequest(): PageTodayRequest | null {
  const holder = globalThis as unknown as Record<string, PageTodayRequest | null | undefined>
  const taken = holder[PAGE_TODAY_REQUEST] ?? null
  delete holder[PAGE_TODAY_REQUEST]
  return taken
}

/**
 * Starts downloading the modules that will read today's answer (its zod schema), beside the
 * app's own script: the app imports them only once it runs, a round trip after it has arrived.
 * Only when today's request went out: other first screens don't need them that early.
 */
export function preloadModules(hrefs: readonly string[], doc: Document = document): void {
  for (const href of hrefs) {
    const link = doc.createElement('link')
    link.rel = 'modulepreload'
    link.href = href
    doc.head.appendChild(link)
  }
}
