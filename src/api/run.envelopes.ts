import { z } from '@shared/schemas/zod'
import { runSessionSchema, runSetSchema, sessionReportSchema } from '@shared/schemas/run.schema'

/** The runner's answer envelopes, loaded on first use by ./run.ts. */
export const sessionEnvelope = z.object({ session: runSessionSchema })
export const currentEnvelope = z.object({ session: z.nullable(runSessionSchema) })
export const loggedSetSchema = z.object({ set: runSetSchema, updated: z.array(runSetSchema) })
export const reportEnvelope = z.object({ report: sessionReportSchema })
