import type { Express } from 'express';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';

/** Reads one cookie's value from a response's Set-Cookie headers. */
export function cookieFrom(res: request.Response, name: string): string | undefined {
  const header = res.headers['set-cookie'] as unknown as string[] | undefined;
  const line = header?.find((c) => c.startsWith(`${name}=`));
  return line ? decodeURIComponent(line.slice(name.length + 1).split(';')[0] ?? '') : undefined;
}

/**
 * A browser-like client: keeps cookies, and echoes the XSRF-TOKEN cookie in X-XSRF-TOKEN on
 * every state-changing request, as Angular's HttpClient does.
 */
export class ApiClient {
  /** The supertest agent (keeps cookies). */
  readonly agent: TestAgent;
  /** The current XSRF token, read from the first GET. */
  xsrf = '';

  constructor(readonly app: Express) {
    this.agent = request.agent(app);
  }

  /** Fetches the XSRF cookie (any GET sets it). */
  async prime(): Promise<this> {
    const res = await this.agent.get('/api/health');
    this.xsrf = cookieFrom(res, 'XSRF-TOKEN') ?? this.xsrf;
    return this;
  }

  /** GET. */
  get(path: string) {
    return this.agent.get(path);
  }

  /** POST with the XSRF header. */
  post(path: string, body?: object) {
    return this.agent.post(path).set('X-XSRF-TOKEN', this.xsrf).send(body);
  }

  /** PATCH with the XSRF header. */
  patch(path: string, body?: object) {
    return this.agent.patch(path).set('X-XSRF-TOKEN', this.xsrf).send(body);
  }

  /** DELETE with the XSRF header. */
  delete(path: string) {
    return this.agent.delete(path).set('X-XSRF-TOKEN', this.xsrf);
  }

  /** Signs in; throws unless the server says 200. */
  async signIn(email: string, password: string): Promise<request.Response> {
    if (!this.xsrf) await this.prime();
    const res = await this.post('/api/auth/login', { email, password });
    if (res.status !== 200)
      throw new Error(`sign-in of ${email} answered ${res.status}: ${res.text}`);
    return res;
  }
}

/** A new client signed in as `email`. */
export async function signedIn(app: Express, email: string, password: string): Promise<ApiClient> {
  const client = new ApiClient(app);
  await client.signIn(email, password);
  return client;
}
