/**
 * Run the engine on one plan file and print the results as JSON.
 *
 *   npm run simulate -- <plan.json> [--summary]
 *
 * --summary prints everything except the hourly series and the day rows. A plan that fails validation
 * exits with code 2 and prints the field errors; an unreadable file exits with code 1.
 * Uses analysePlan(), the same function the server and the browser call.
 */
import { readFileSync } from 'node:fs'
import { analysePlan, parsePlan, resultsToJson } from '../shared/engine/index.ts'

function main(argv: string[]): number {
  const args = argv.filter((a) => !a.startsWith('--'))
  const summaryOnly = argv.includes('--summary')
  const unknown = argv.filter((a) => a.startsWith('--') && a !== '--summary')
  if (args.length !== 1 || unknown.length > 0) {
    process.stderr.write('usage: npm run simulate -- <plan.json> [--summary]\n')
    return 1
  }
  const file = args[0]!
  let input: unknown
  try {
    input = JSON.parse(readFileSync(file, 'utf8'))
  } catch (e) {
    process.stderr.write(`cannot read ${file}: ${(e as Error).message}\n`)
    return 1
  }
  const parsed = parsePlan(input)
  if (!parsed.ok) {
    process.stderr.write(
      JSON.stringify(
        { error: { code: 'invalid_plan', message: `${file} is not a valid plan`, fields: parsed.fields } },
        null,
        2,
      ) + '\n',
    )
    return 2
  }
  const analysis = analysePlan(parsed.plan)
  const json = resultsToJson(analysis)
  const out = summaryOnly ? { ...json, series: undefined, days: undefined } : json
  process.stdout.write(JSON.stringify(out, null, summaryOnly ? 2 : undefined) + '\n')
  return 0
}

process.exitCode = main(process.argv.slice(2))
