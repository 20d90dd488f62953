import { listSessions, type ListSessionsParams } from '@/api/sessions'
import { useAsync } from './useAsync'

/** The logbook: the signed-in lifter's sessions, newest first (or a named athlete's for a coach). */
export function useSessions(params: ListSessionsParams = {}) {
  return useAsync(() => listSessions(params))
}
