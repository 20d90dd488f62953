// The script inlined in index.html's <head> (build/inline-early-script.ts): it runs while the
// browser fetches the app's JavaScript. See ./today-request.ts.
import { PAGE_TODAY_REQUEST, preloadModules, sendPageTodayRequest } from './today-request'

/** The JavaScript files that read today's answer (its schema and what that imports); set by the build. */
declare const __EARLY_TODAY_MODULES__: readonly string[]

const sent = sendPageTodayRequest(location.pathname)
;(globalThis as unknown as Record<string, unknown>)[PAGE_TODAY_REQUEST] = sent
if (sent) preloadModules(__EARLY_TODAY_MODULES__)
