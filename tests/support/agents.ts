import request from 'supertest';
import type { Express } from 'express';

export const ORIGIN = 'http://127.0.0.1:3000';
export type DemoRole = 'admin' | 'curator' | 'researcher' | 'dyer';

/** A supertest agent signed in as a demo account (or as any e-mail/password). */
export async function signedInAgent(app: Express, who: DemoRole | { email: string; password: string }) {
  const agent = request.agent(app);
  const creds = typeof who === 'string' ? { email: `${who}@demo.test`, password: 'tinctoria-demo' } : who;
  const res = await agent.post('/api/auth/login').set('Origin', ORIGIN).send(creds);
  if (res.status !== 200)
    throw new Error(`sign-in as ${creds.email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}
