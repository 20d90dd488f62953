import type { ZodType } from 'zod'
import { apiErrorBodySchema, type ApiErrorBody } from '@shared/schemas/common.schema'

export type HttpMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'
export type ApiIssue = NonNullable<ApiErrorBody['error']['issues']>[number]

/** A non-2xx answer from the API (or no answer at all: status 0). */
export class ApiError extends Error {
  override readonly name = 'ApiError'
  readonly status: number
  readonly code: string
  readonly issues: ApiIssue[]

  constructor(status: number, code: string, message: string, issues: ApiIssue[] = []) {
    super(message)
    this.status = status
    this.code = code
    this.issues = issues
  }
}

export interface RequestOptions<T> {
  /** JSON-serialisable data, or a FormData for a multipart upload. */
  body?: unknown
  query?: Record<string, string | number | boolean | null | undefined>
  /** Validates the response body; a mismatch throws an ApiError with code 'bad_response'. */
  schema?: ZodType<T>
}

let authToken: string | null = null

/** The session store pushes the token in here, so api/ never imports stores/. */
export function setAuthToken(token: string | null): void {
  authToken = token
}

function buildUrl(path: string, query: RequestOptions<unknown>['query']): string {
  const params = new URLSearchParams()
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value !== undefined && value !== null) params.set(key, String(value))
  }
  const search = params.toString()
  return `/api${path}${search ? `?${search}` : ''}`
}

async function readJson(response: Response): Promise<unknown> {
  const text = await response.text()
  if (!text) return undefined
  try {
    return JSON.parse(text)
  } catch {
    return undefined
  }
}

function toApiError(status: number, body: unknown, statusText: string): ApiError {
  const parsed = apiErrorBodySchema.safeParse(body)
  if (parsed.success) {
    const { code, message, issues } = parsed.data.error
    return new ApiError(status, code, message, issues ?? [])
  }
  return new ApiError(status, 'http_error', statusText || `Request failed with status ${status}`)
}

/** The app's only fetch: JSON in, JSON out, `/api` prefixed, bearer token attached. */
export async function request<T = unknown>(
  method: HttpMethod,
  path: string,
  options: RequestOptions<T> = {},
): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' }
  // A FormData body (a file upload) goes as multipart: the browser sets its own Content-Type.
  const isForm = typeof FormData !== 'undefined' && options.body instanceof FormData
  if (options.body !== undefined && !isForm) headers['Content-Type'] = 'application/json'
  if (authToken) headers.Authorization = `Bearer ${authToken}`

  let response: Response
  try {
    response = await fetch(buildUrl(path, options.query), {
      method,
      headers,
      body: options.body === undefined ? undefined : isForm ? (options.body as FormData) : JSON.stringify(options.body),
    })
  } catch {
    throw new ApiError(0, 'network_error', 'No connection to the server. Check your signal and try again.')
  }

  const body = await readJson(response)
  if (!response.ok) throw toApiError(response.status, body, response.statusText)
  if (!options.schema) return body as T

  const parsed = options.schema.safeParse(body)
  if (!parsed.success) {
    throw new ApiError(response.status, 'bad_response', 'The server sent an answer this app does not understand.')
  }
  return parsed.data
}

/** A multipart upload (a FormData body) through the same request path. */
export function requestForm<T = unknown>(method: HttpMethod, path: string, form: FormData, options: Omit<RequestOptions<T>, 'body'> = {}) {
  return request<T>(method, path, { ...options, body: form })
}

/** A file download (an export): the body as a Blob, with the server's file name when it gives one. */
export async function requestBlob(path: string, query?: RequestOptions<unknown>['query']): Promise<{ blob: Blob; filename: string | null }> {
  const headers: Record<string, string> = {}
  if (authToken) headers.Authorization = `Bearer ${authToken}`
  let response: Response
  try {
    response = await fetch(buildUrl(path, query), { method: 'GET', headers })
  } catch {
    throw new ApiError(0, 'network_error', 'No connection to the server. Check your signal and try again.')
  }
  if (!response.ok) throw toApiError(response.status, await readJson(response), response.statusText)
  const disposition = response.headers.get('Content-Disposition') ?? ''
  const filename = /filename="?([^";]+)"?/.exec(disposition)?.[1] ?? null
  return { blob: await response.blob(), filename }
}
