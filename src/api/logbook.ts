import { z } from '@shared/schemas/zod'
import {
  importPreviewSchema,
  importResultSchema,
  type ImportPreview,
  type ImportRequest,
  type ImportResult,
} from '@shared/schemas/logbook.schema'
import { setKindSchema } from '@shared/schemas/session.schema'
import { unitSchema } from '@shared/schemas/common.schema'
import { request, requestBlob } from './client'

export type LogbookFormat = 'csv' | 'json'

/** The whole logbook as a file (CSV or JSON) with the server's file name; a coach names the athlete. */
export async function downloadLogbook(format: LogbookFormat, athleteId?: number): Promise<{ blob: Blob; filename: string | null }> {
  return requestBlob('/logbook/export', { format, athleteId })
}

/** The JSON export read as data: every completed session with its logged sets, oldest first. */
export const logbookExportSchema = z.object({
  unit: unitSchema,
  sessions: z.array(
    z.object({
      date: z.string(),
      completedAt: z.nullable(z.string()),
      day: z.nullable(z.string()),
      version: z.nullable(z.string()),
      note: z.nullable(z.string()),
      sets: z.array(
        z.object({
          exercise: z.string(),
          kind: setKindSchema,
          loadKg: z.nullable(z.number()),
          reps: z.nullable(z.int()),
          rir: z.nullable(z.int()),
          failure: z.boolean(),
          note: z.nullable(z.string()),
        }),
      ),
    }),
  ),
})
export type LogbookExport = z.infer<typeof logbookExportSchema>

export async function getLogbook(): Promise<LogbookExport> {
  return request('GET', '/logbook/export', { query: { format: 'json' }, schema: logbookExportSchema })
}

const previewEnvelopeSchema = z.object({ preview: importPreviewSchema })
const resultEnvelopeSchema = z.object({ result: importResultSchema })

/** Checks a CSV file against the column mapping; nothing is written. */
export async function previewLogbookImport(input: ImportRequest): Promise<ImportPreview> {
  return (await request('POST', '/logbook/import/preview', { body: input, schema: previewEnvelopeSchema })).preview
}

/** Imports every row of the file, or nothing when any row is bad. */
export async function importLogbook(input: ImportRequest): Promise<ImportResult> {
  return (await request('POST', '/logbook/import', { body: input, schema: resultEnvelopeSchema })).result
}
