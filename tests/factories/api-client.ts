import type { Express } from 'express'
import request from 'supertest'
import { DEMO_PASSWORDS, DEMO_SHOPS, DEMO_STAFF } from '../../seeders/demo/scenario'

/** A cookie-keeping client that fetches the CSRF token once and sends it on every write. */
export class ApiClient {
  readonly agent: ReturnType<typeof request.agent>
  csrf: string | null = null

  constructor(readonly app: Express) {
    this.agent = request.agent(app)
  }

  async token() {
    if (!this.csrf) {
      const r = await this.agent.get('/api/auth/csrf').expect(200)
      this.csrf = r.body.csrfToken as string
    }
    return this.csrf
  }

  get(url: string) {
    return this.agent.get(url)
  }
  // The token is fetched before the request is made: the agent attaches cookies at creation.
  async post(url: string, body?: unknown, headers: Record<string, string> = {}) {
    const token = await this.token()
    return this.agent
      .post(url)
      .set('X-CSRF-Token', token)
      .set(headers)
      .send(body as object)
  }
  async put(url: string, body?: unknown) {
    const token = await this.token()
    return this.agent
      .put(url)
      .set('X-CSRF-Token', token)
      .send(body as object)
  }
  async patch(url: string, body?: unknown) {
    const token = await this.token()
    return this.agent
      .patch(url)
      .set('X-CSRF-Token', token)
      .send(body as object)
  }
  async delete(url: string) {
    const token = await this.token()
    return this.agent.delete(url).set('X-CSRF-Token', token)
  }

  async login(email: string, password: string) {
    const r = await this.post('/api/auth/login', { email, password })
    if (r.status !== 200) throw new Error(`sign-in as ${email} failed: ${r.status} ${JSON.stringify(r.body)}`)
    return r.body.user as { id: number; role: string; shopId: number | null }
  }
}

export const DEMO = {
  owner: { email: DEMO_STAFF[0]!.email, password: DEMO_PASSWORDS.owner },
  packer: { email: DEMO_STAFF[1]!.email, password: DEMO_PASSWORDS.packer },
  buyerA: { email: DEMO_SHOPS[0]!.buyer.email, password: DEMO_PASSWORDS.buyer },
  buyerB: { email: DEMO_SHOPS[1]!.buyer.email, password: DEMO_PASSWORDS.buyer },
  buyerC: { email: DEMO_SHOPS[2]!.buyer.email, password: DEMO_PASSWORDS.buyer },
}
export type DemoCaller = keyof typeof DEMO

/** A client signed in as one of the demo people (or signed out for 'anon'). */
export async function clientAs(app: Express, who: DemoCaller | 'anon') {
  const c = new ApiClient(app)
  if (who !== 'anon') await c.login(DEMO[who].email, DEMO[who].password)
  return c
}
