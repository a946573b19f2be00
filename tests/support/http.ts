/** A small HTTP client with a cookie jar, talking to the real server like a browser would. */
import { inject } from 'vitest';

export class Client {
  readonly base = inject('baseUrl');
  private cookies = new Map<string, string>();

  private cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  private keep(res: Response) {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair!.indexOf('=');
      const name = pair!.slice(0, i);
      const value = pair!.slice(i + 1);
      if (value === '' || /max-age=0/i.test(c)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<{ status: number; json: any; res: Response }> {
    const h: Record<string, string> = { origin: this.base, ...headers };
    if (this.cookies.size) h.cookie = this.cookieHeader();
    let payload: BodyInit | undefined;
    if (typeof body === 'string' || body instanceof FormData) payload = body;
    else if (body !== undefined) {
      payload = JSON.stringify(body);
      h['content-type'] ??= 'application/json';
    }
    const res = await fetch(this.base + path, { method, headers: h, body: payload, redirect: 'manual' });
    this.keep(res);
    const text = await res.text();
    let json: any = null;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = text;
    }
    return { status: res.status, json, res };
  }

  get = (p: string) => this.request('GET', p);
  post = (p: string, b?: unknown) => this.request('POST', p, b);
  patch = (p: string, b?: unknown) => this.request('PATCH', p, b);
  put = (p: string, b?: unknown) => this.request('PUT', p, b);
  del = (p: string) => this.request('DELETE', p);

  async signIn(email: string, password: string) {
    const r = await this.post('/api/auth/sign-in/email', { email, password });
    if (r.status !== 200) throw new Error(`sign-in of ${email} failed: ${r.status} ${JSON.stringify(r.json)}`);
    return this;
  }

  /** Follows a link from an e-mail (e.g. verification), keeping cookies it sets. */
  async follow(url: string) {
    const res = await fetch(url, { headers: this.cookies.size ? { cookie: this.cookieHeader() } : {}, redirect: 'manual' });
    this.keep(res);
    return res;
  }
}

export const DEMO = {
  password: 'ledger-demo-2026',
  owner: 'owner@northgate.example',
  energy: 'energy@northgate.example',
  consultant: 'consultant@fieldline.example',
  finance: 'finance@northgate.example',
};

export async function as(email: string) {
  return new Client().signIn(email, DEMO.password);
}
