import { z } from './zod'

/**
 * Version I or II: the two alternating versions of a split day. In a module of its own because
 * Train's answer (train.schema.ts) needs only this: importing it from session.schema.ts built
 * every session and set-log schema too, on the Train screen's way to its first card.
 */
export const versionLabelSchema = z.enum(['I', 'II'])
export type VersionLabel = z.infer<typeof versionLabelSchema>
