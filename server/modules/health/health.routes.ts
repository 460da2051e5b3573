import { Router } from 'express'
import { pool } from '@server/db/sequelize'

export function healthRoutes() {
  const r = Router()
  r.get('/', async (_req, res) => {
    try {
      await pool.query('SELECT 1')
      res.json({ ok: true, db: 'up' })
    } catch {
      res.status(503).json({ ok: false, db: 'down' })
    }
  })
  return r
}
