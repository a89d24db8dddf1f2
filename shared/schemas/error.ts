import { z } from 'zod'

/** The one error shape every API route answers with: `{ error: { code, message, fields? } }`. */
export const ApiErrorBodySchema = z.object({
  error: z
    .object({
      code: z.string(),
      message: z.string(),
      fields: z.record(z.string(), z.array(z.string())).optional(),
    })
    .passthrough(),
})

export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>
