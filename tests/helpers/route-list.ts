import type { Router } from 'express'

export interface RouteEntry {
  method: string
  path: string
}

interface Layer {
  route?: { path: string; methods: Record<string, boolean> }
  handle?: { stack?: Layer[] }
}

/** Every route of an Express router, nested routers included, read from the router itself. */
export function listRoutes(router: Router): RouteEntry[] {
  const out: RouteEntry[] = []
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all') out.push({ method: method.toUpperCase(), path: layer.route.path })
        }
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack)
      }
    }
  }
  walk((router as unknown as { stack: Layer[] }).stack)
  return out
}

/** A concrete URL for a route pattern: numbers for :id-like params, a UUID for :setId, a token for :token. */
export function fillPath(path: string): string {
  return path
    .replace(':setId', '00000000-0000-4000-8000-000000000000')
    .replace(':token', 'x'.repeat(43))
    .replace(/:[A-Za-z]+/g, '1')
}
