import { randomUUID } from 'node:crypto'
import { extname } from 'node:path'
import { Router, type RequestHandler } from 'express'
import multer from 'multer'
import {
  LogCalibrateRequestSchema,
  LogCompareQuerySchema,
  LogMappingRequestSchema,
} from '../../../shared/logs/api'
import { LOG_LIMITS } from '../../../shared/logs/types'
import type { AppContext } from '../../context'
import { HttpError } from '../../errors'
import { requireUser } from '../../middleware/require-user'
import { parse } from '../../validate'
import { actorOf } from '../vehicles/actor'
import { requireVehicleRole } from '../vehicles/access'
import * as logs from './logs.service'
import { ensurePendingDir, pendingFile } from './pending'

const EXTENSIONS = new Set(['.csv', '.txt', '.tsv'])
// Browsers label CSV files in many ways; the content is checked after the upload (NUL bytes = not text).
const MIME_TYPES = new Set([
  'text/csv',
  'text/plain',
  'text/tab-separated-values',
  'application/csv',
  'application/vnd.ms-excel',
  'application/octet-stream',
  '',
])

/** multer to a temporary file with a size limit and a CSV type/extension check; errors in our shape. */
function uploadFile(): RequestHandler {
  const dir = ensurePendingDir()
  const upload = multer({
    storage: multer.diskStorage({
      destination: dir,
      filename: (_req, _file, cb) => {
        const uploadId = randomUUID()
        cb(null, pendingFile(uploadId).slice(dir.length + 1))
      },
    }),
    limits: { fileSize: LOG_LIMITS.maxFileBytes, files: 1, fields: 5, parts: 6 },
    fileFilter: (_req, file, cb) => {
      const ext = extname(file.originalname).toLowerCase()
      if (!EXTENSIONS.has(ext) || !MIME_TYPES.has(file.mimetype)) {
        cb(
          new HttpError(
            415,
            'not_csv',
            `“${file.originalname}” is not a CSV file. Export the log from your monitor's app as CSV (.csv or .txt).`,
          ),
        )
        return
      }
      cb(null, true)
    },
  }).single('file')
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next()
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(
            new HttpError(
              413,
              'file_too_large',
              `The file is larger than ${LOG_LIMITS.maxFileBytes / 1024 / 1024} MB. Split it into shorter periods.`,
            ),
          )
        }
        return next(new HttpError(400, 'bad_upload', `The upload was refused: ${err.message}.`))
      }
      next(err)
    })
  }
}

/** /api/vehicles/:vehicleId/logs… and /api/logs/:uploadId… (docs/logs.md). */
export function logsRouter(ctx: AppContext): Router {
  const { db } = ctx
  const r = Router()
  const auth: RequestHandler = requireUser
  const canWrite: RequestHandler = async (req, res, next) => {
    await requireVehicleRole(db, actorOf(res).id, String(req.params.vehicleId), 'write')
    next()
  }

  r.get('/vehicles/:vehicleId/logs', auth, async (req, res) => {
    res.json(await logs.listUploads(db, actorOf(res), String(req.params.vehicleId)))
  })
  r.post('/vehicles/:vehicleId/logs/preview', auth, canWrite, uploadFile(), async (req, res) => {
    const file = req.file
    if (!file) throw new HttpError(400, 'no_file', 'Choose a CSV file to upload (form field “file”).')
    const uploadId = file.filename.replace(/\.csv$/, '')
    res.json(
      await logs.previewUpload(db, actorOf(res), String(req.params.vehicleId), {
        path: file.path,
        originalName: file.originalname,
        sizeBytes: file.size,
        uploadId,
      }),
    )
  })
  r.post('/vehicles/:vehicleId/logs/:uploadId/check', auth, canWrite, async (req, res) => {
    const { mapping } = parse(LogMappingRequestSchema, req.body)
    res.json(
      await logs.checkUpload(
        actorOf(res),
        String(req.params.vehicleId),
        String(req.params.uploadId),
        mapping,
      ),
    )
  })
  r.post('/vehicles/:vehicleId/logs/:uploadId/import', auth, canWrite, async (req, res) => {
    const { mapping } = parse(LogMappingRequestSchema, req.body)
    res
      .status(201)
      .json(
        await logs.importUpload(
          ctx,
          actorOf(res),
          String(req.params.vehicleId),
          String(req.params.uploadId),
          mapping,
        ),
      )
  })
  r.get('/logs/:uploadId', auth, async (req, res) => {
    res.json(await logs.getUpload(db, actorOf(res), String(req.params.uploadId), 'read'))
  })
  r.delete('/logs/:uploadId', auth, async (req, res) => {
    await logs.deleteUpload(db, actorOf(res), String(req.params.uploadId))
    res.status(204).end()
  })
  r.get('/logs/:uploadId/days', auth, async (req, res) => {
    res.json(await logs.uploadDays(db, actorOf(res), String(req.params.uploadId)))
  })
  r.get('/logs/:uploadId/compare', auth, async (req, res) => {
    const { scenarioId } = parse(LogCompareQuerySchema, req.query)
    res.json(await logs.compareUpload(db, actorOf(res), String(req.params.uploadId), scenarioId))
  })
  r.post('/logs/:uploadId/calibrate', auth, async (req, res) => {
    const input = parse(LogCalibrateRequestSchema, req.body)
    res.status(201).json(await logs.calibrateScenario(db, actorOf(res), String(req.params.uploadId), input))
  })
  return r
}
