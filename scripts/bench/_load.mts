import { loadScenario } from './scenario'
const f = await loadScenario(process.argv[2]!, console.log)
console.log(JSON.stringify({ ...f, buyers: f.buyers.length }, null, 1))
