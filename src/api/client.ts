import type { z } from '@shared/schemas/zod'
import type { ApiErrorBody } from '@shared/schemas/common.schema'

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
  /**
   * Validates the response body; a mismatch throws an ApiError with code 'bad_response'.
   * May be a loader (`() => import('@shared/schemas/x.schema').then((m) => m.xSchema)`): it is
   * started together with the request, so building the schema (zod's work) overlaps the network
   * wait instead of running on the app's start-up path.
   */
  schema?: SchemaOrLoader<T>
}

export type SchemaOrLoader<T> = z.ZodMiniType<T> | (() => Promise<z.ZodMiniType<T>>)

/** The error body's schema, built the first time an error answer needs it. */
const loadErrorBodySchema = () => import('@shared/schemas/common.schema').then((m) => m.apiErrorBodySchema)

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

async function toApiError(status: number, body: unknown, statusText: string): Promise<ApiError> {
  const schema = await loadErrorBodySchema().catch(() => null)
  const parsed = schema ? schema.safeParse(body) : { success: false as const }
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
  const schema = typeof options.schema === 'function' ? options.schema() : options.schema
  // A loader that fails (its chunk could not be fetched) is reported once the answer is read.
  if (schema instanceof Promise) schema.catch(() => {})

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
  if (!response.ok) throw await toApiError(response.status, body, response.statusText)
  if (!schema) return body as T

  let checker: z.ZodMiniType<T>
  try {
    checker = await schema
  } catch {
    throw new ApiError(0, 'network_error', 'No connection to the server. Check your signal and try again.')
  }
  const parsed = checker.safeParse(body)
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
  if (!response.ok) throw await toApiError(response.status, await readJson(response), response.statusText)
  const disposition = response.headers.get('Content-Disposition') ?? ''
  const filename = /filename="?([^";]+)"?/.exec(disposition)?.[1] ?? null
  return { blob: await response.blob(), filename }
}
