/** The library of typical appliances (data/appliance-library.json), checked by the shared schema once. */
import { readFileSync } from 'node:fs'
import { Router } from 'express'
import {
  ApplianceLibrarySchema,
  hoursFitWindowIssue,
  type ApplianceLibrary,
} from '../../../shared/schemas/vehicles'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { projectPath } from '../../paths'

const LIBRARY_URL = projectPath('data', 'appliance-library.json')
let cached: ApplianceLibrary | null = null

/** Throws (at the first request, and in the tests) if the file breaks the schema. */
export function loadApplianceLibrary(): ApplianceLibrary {
  if (!cached) {
    const library = ApplianceLibrarySchema.parse(JSON.parse(readFileSync(LIBRARY_URL, 'utf8')))
    for (const item of library.items) {
      const issue = hoursFitWindowIssue(item)
      if (issue) throw new Error(`data/appliance-library.json ${item.key}: ${issue}`)
    }
    cached = library
  }
  return cached
}

/** /api/appliance-library */
export function applianceLibraryRouter(_ctx: AppContext): Router {
  const r = Router()
  r.use(requireUser)
  r.get('/', (_req, res) => {
    res.json(loadApplianceLibrary())
  })
  return r
}
