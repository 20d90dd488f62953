import { todaySchema, type Today } from '@shared/schemas/train.schema'
import { request } from './client'

export function getToday(): Promise<Today> {
  return request('GET', '/train/today', { schema: todaySchema })
}
