import { vi } from 'vitest'
import type { User } from '@shared/schemas/auth.schema'

export interface RecordedRequest {
  method: string
  url: string
  headers: Record<string, string>
  body: unknown
}

type Reply = { status: number; body?: unknown }

/** Replaces global fetch with a stub that records each request and answers from a queue. */
export function stubFetch(...replies: Reply[]) {
  const requests: RecordedRequest[] = []
  const queue = [...replies]
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    requests.push({
      method: init.method ?? 'GET',
      url: String(input),
      headers: { ...(init.headers as Record<string, string>) },
      body: typeof init.body === 'string' ? JSON.parse(init.body) : init.body,
    })
    const reply = queue.shift() ?? { status: 500, body: { error: { code: 'unexpected', message: 'No reply queued' } } }
    const text = reply.body === undefined ? null : JSON.stringify(reply.body)
    return new Response(text, { status: reply.status, headers: { 'Content-Type': 'application/json' } })
  })
  vi.stubGlobal('fetch', fetchMock)
  return { fetchMock, requests }
}

export function buildUser(overrides: Partial<User> = {}): User {
  return {
    id: 7,
    name: 'Robin Hale',
    email: 'robin@example.com',
    role: 'lifter',
    unit: 'kg',
    active: true,
    cautionsAcknowledgedAt: '2026-11-30T09:00:00.000Z',
    notifyCompleted: 'each',
    createdAt: '2026-11-01T09:00:00.000Z',
    ...overrides,
  }
}
