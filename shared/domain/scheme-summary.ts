import { setSchemeSchema, type SchemeSet } from './schemes'

function effort(set: SchemeSet): string {
  return set.toFailure ? 'to failure' : `RIR ${set.targetRir}`
}

/**
 * A one-line summary of a set scheme for previews, e.g.
 * "top set 6-9 to failure · 1 back-off 9-12" or "3 sets 8-10 / 10-12 / 12-15 · RIR 1".
 */
export function describeScheme(raw: unknown): string {
  const parsed = setSchemeSchema.safeParse(raw)
  if (!parsed.success) return 'custom sets'
  const { sets } = parsed.data
  const range = (s: SchemeSet) => (s.repsMin === s.repsMax ? `${s.repsMin}` : `${s.repsMin}-${s.repsMax}`)
  const parts: string[] = []
  const [first] = sets
  let rest = sets
  if (first.kind === 'top') {
    parts.push(`top set ${range(first)} ${effort(first)}`)
    rest = sets.slice(1)
    const backoffs = rest.filter((s) => s.kind === 'backoff')
    if (backoffs.length > 0) {
      const efforts = [...new Set(backoffs.map(effort))]
      parts.push(`${backoffs.length} back-off ${[...new Set(backoffs.map(range))].join(' / ')} ${efforts.join(', ')}`)
    }
    rest = rest.filter((s) => s.kind !== 'backoff')
  }
  if (rest.length > 0) {
    const efforts = [...new Set(rest.map(effort))]
    parts.push(`${rest.length} ${rest.length === 1 ? 'set' : 'sets'} ${rest.map(range).join(' / ')} ${efforts.join(', ')}`)
  }
  return parts.join(' · ')
}
