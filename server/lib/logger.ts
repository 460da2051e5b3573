import { env } from '@server/config/env'

const LEVELS = { debug: 10, info: 20, warn: 30, error: 40, silent: 100 } as const
type Level = Exclude<keyof typeof LEVELS, 'silent'>
const threshold = LEVELS[env.LOG_LEVEL]

function write(level: Level, message: string, meta?: Record<string, unknown>) {
  if (LEVELS[level] < threshold) return
  const line = JSON.stringify({ time: new Date().toISOString(), level, message, ...meta })
  if (level === 'error') console.error(line)
  else if (level === 'warn') console.warn(line)
  else console.log(line)
}

/** The one logger: JSON lines, level from LOG_LEVEL. */
export const logger = {
  debug: (m: string, meta?: Record<string, unknown>) => write('debug', m, meta),
  info: (m: string, meta?: Record<string, unknown>) => write('info', m, meta),
  warn: (m: string, meta?: Record<string, unknown>) => write('warn', m, meta),
  error: (m: string, meta?: Record<string, unknown>) => write('error', m, meta),
}
