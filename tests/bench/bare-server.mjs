// The baseline for the API benchmark: a bare Express 5 app with one JSON route for GET and one
// JSON body route for PUT, no database, no auth, in its own process like the real server.
import express from 'express'

const app = express()
app.use(express.json({ limit: '16kb' }))
app.get('/bare', (_req, res) => {
  res.json({ ok: true, at: Date.now() })
})
app.put('/bare/:id', (req, res) => {
  res.json({ id: req.params.id, received: Object.keys(req.body ?? {}).length })
})
const server = app.listen(Number(process.env.PORT), '127.0.0.1', () => {
  process.stdout.write('ready\n')
})
process.on('SIGTERM', () => server.close(() => process.exit(0)))
