import { startBenchDb } from './stack'
const db = await startBenchDb(console.log)
console.log(db.url)
process.on('SIGTERM', () => { db.destroy(); process.exit(0) })
setInterval(() => {}, 1000)
