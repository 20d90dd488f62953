import { listUsers } from '@/api/admin'
import { useAsync } from './useAsync'

/** Every account, for the admin's Accounts tab. */
export function useAdminUsers() {
  return useAsync(listUsers)
}
