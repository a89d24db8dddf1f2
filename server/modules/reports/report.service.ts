/**
 * The PDF report of a scenario (issue 10): gathers the plan, the stored results (same memo as the Outlook),
 * the build sheet for this scenario and the advisor's comments, lays them out (report.document.ts) and
 * renders with pdfmake 0.3 on the server, with Nunito TTF files shipped by the npm package
 * @expo-google-fonts/nunito (OFL-1.1).
 */
import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'
import { and, asc, eq, inArray } from 'drizzle-orm'
import { REVIEW_VERDICT_LABEL, type ReviewVerdict } from '../../../shared/schemas/reviews'
import type { Db } from '../../db/client'
import { reviewComments, reviews, users, vehicles } from '../../db/schema/index'
import { notFound } from '../../errors'
import { getBuildSheet } from '../buildsheet/buildsheet.service'
import { buildPlanForScenario } from '../scenarios/plan'
import { loadScenarioForUser } from '../scenarios/scenarios.service'
import { resultsForPlan } from '../results/results.service'
import type { Actor } from '../vehicles/records'
import { buildReportDocument, type ReportInput, type ReportReview } from './report.document'

const require = createRequire(import.meta.url)
const FONT_DIR = dirname(require.resolve('@expo-google-fonts/nunito/package.json'))
export const REPORT_FONTS = {
  Nunito: {
    normal: join(FONT_DIR, '400Regular/Nunito_400Regular.ttf'),
    bold: join(FONT_DIR, '700Bold/Nunito_700Bold.ttf'),
    italics: join(FONT_DIR, '400Regular_Italic/Nunito_400Regular_Italic.ttf'),
    bolditalics: join(FONT_DIR, '700Bold_Italic/Nunito_700Bold_Italic.ttf'),
  },
}
const FONT_FILES = new Set(Object.values(REPORT_FONTS.Nunito))

/**
 * pdfmake (with pdfkit, fontkit and their fonts' code) is loaded on the first report, not at start: it is
 * about a fifth of the server's resting memory and most server processes never render a PDF.
 */
let pdfmakeLoaded: Promise<(typeof import('pdfmake'))['default']> | null = null
function loadPdfmake() {
  pdfmakeLoaded ??= import('pdfmake').then(({ default: pdfmake }) => {
    pdfmake.setFonts(REPORT_FONTS)
    // The report reads nothing from the network and only the shipped font files from disk.
    pdfmake.setUrlAccessPolicy(() => false)
    pdfmake.setLocalAccessPolicy((path) => FONT_FILES.has(path))
    return pdfmake
  })
  return pdfmakeLoaded
}

/** Comments the advisors wrote on reviews of this scenario (not the client's, not event lines). */
async function advisorReviews(db: Db, scenarioId: string): Promise<ReportReview[]> {
  const rows = await db
    .select({
      id: reviews.id,
      advisorId: reviews.advisorId,
      state: reviews.state,
      verdict: reviews.verdict,
      summary: reviews.summary,
      advisorName: users.displayName,
    })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.advisorId))
    .where(eq(reviews.scenarioId, scenarioId))
    .orderBy(asc(reviews.createdAt))
  if (rows.length === 0) return []
  const comments = await db
    .select()
    .from(reviewComments)
    .where(
      and(
        inArray(
          reviewComments.reviewId,
          rows.map((r) => r.id),
        ),
        eq(reviewComments.kind, 'comment'),
      ),
    )
    .orderBy(asc(reviewComments.createdAt))
  return rows.map((r) => ({
    advisorName: r.advisorName,
    state: r.state,
    verdictLabel: r.verdict ? REVIEW_VERDICT_LABEL[r.verdict as ReviewVerdict] : null,
    summary: r.summary,
    comments: comments
      .filter((c) => c.reviewId === r.id && c.authorId === r.advisorId)
      .map((c) => ({
        author: r.advisorName,
        at: c.createdAt.toISOString().slice(0, 10),
        pinLabel: c.pinLabel,
        body: c.body,
      })),
  }))
}

/** Everything the report shows, for a scenario the user can read. */
export async function reportInput(
  db: Db,
  actor: Actor,
  scenarioId: string,
  now = new Date(),
): Promise<ReportInput> {
  const { row } = await loadScenarioForUser(db, actor.id, scenarioId, 'read')
  const [vehicle] = await db
    .select({ name: vehicles.name, kind: vehicles.kind, systemVoltageV: vehicles.systemVoltageV })
    .from(vehicles)
    .where(eq(vehicles.id, row.vehicleId))
  if (!vehicle) throw notFound('That vehicle')
  const plan = await buildPlanForScenario(db, row.id)
  const { results } = resultsForPlan(plan)
  const [sheet, reviewList] = await Promise.all([
    getBuildSheet(db, actor, row.vehicleId, row.id),
    advisorReviews(db, row.id),
  ])
  return {
    vehicle,
    scenario: { name: row.name, placeName: row.placeName, notes: row.notes },
    plan,
    results,
    sheet: sheet.sheet as ReportInput['sheet'],
    sheetMissing: sheet.missing,
    reviews: reviewList,
    generatedAt: now,
  }
}

export async function renderReportPdf(input: ReportInput): Promise<Buffer> {
  const pdfmake = await loadPdfmake()
  return pdfmake.createPdf(buildReportDocument(input)).getBuffer()
}
