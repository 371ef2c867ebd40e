// For the bench's second ingest figure only: the raw Knex insert behind a bare HTTP hop. A plain
// node:http server, in its own process as the app's server is, takes the same JSON body the sync route
// takes, parses it and inserts its rows with the same four statements as the raw side, with no sign-in,
// validation, decisions, audit or receipt. Run as a child: `bare-ingest.ts <database> <leadId>`.
import { createServer } from 'node:http'
import { connect } from '../migrate'

const [database, authorId] = process.argv.slice(2)
const db = connect(database!)
const snake = (record: Record<string, unknown>) => Object.fromEntries(Object.entries(record).map(([k, v]) => [k.replace(/[A-Z]/g, c => `_${c.toLowerCase()}`), v]))
type Change = { kind: string, record: Record<string, unknown> }

const server = createServer((req, res) => {
  const chunks: Buffer[] = []
  req.on('data', (chunk: Buffer) => chunks.push(chunk))
  req.on('end', () => {
    const { changes } = JSON.parse(Buffer.concat(chunks).toString('utf8')) as { changes: Change[] }
    const of = (kind: string) => changes.filter(c => c.kind === kind).map(c => c.record)
    const jobId = of('day_sheet')[0]?.jobId
    db.transaction(async (trx) => {
      await trx('day_sheets').insert(of('day_sheet').map(s => snake({ ...s, authorId })))
      await trx('time_entries').insert(of('time_entry').map(snake))
      await trx('lifts').insert(of('lift').map(l => snake({ ...l, jobId })))
      await trx('material_drops').insert(of('material_drop').map(d => snake({ ...d, jobId })))
    }).then(() => {
      res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify({ inserted: changes.length }))
    }, (error: Error) => {
      res.writeHead(500, { 'content-type': 'application/json' }).end(JSON.stringify({ error: error.message }))
    })
  })
})
server.listen(0, '127.0.0.1', () => {
  const address = server.address()
  process.stdout.write(`${typeof address === 'object' && address ? address.port : 0}\n`)
})
process.on('SIGTERM', () => {
  server.close()
  void db.destroy().then(() => process.exit(0))
})
