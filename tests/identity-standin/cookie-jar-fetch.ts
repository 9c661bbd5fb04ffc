/**
 * A tiny browser for tests: fetch with a cookie jar and manual redirects, so each hop can be checked.
 * Cookies are matched by path only (all servers in a test run on 127.0.0.1, and browsers do not
 * separate cookies by port either).
 */
export interface Hop {
  url: string;
  status: number;
  location?: string;
  body: string;
  headers: Headers;
}

interface StoredCookie {
  name: string;
  value: string;
  path: string;
}

function pathMatches(cookiePath: string, requestPath: string): boolean {
  if (requestPath === cookiePath) return true;
  if (!requestPath.startsWith(cookiePath)) return false;
  return cookiePath.endsWith('/') || requestPath[cookiePath.length] === '/';
}

export class CookieJarFetch {
  private readonly cookies = new Map<string, StoredCookie>();

  /** Names of the cookies held now. */
  cookieNames(): string[] {
    return [...this.cookies.values()].map((c) => c.name).sort();
  }

  /** Every cookie value held now (to check that none of them is ever logged). */
  cookieValues(): string[] {
    return [...this.cookies.values()].map((c) => c.value);
  }

  private cookieHeader(url: URL): string | undefined {
    const matching = [...this.cookies.values()]
      .filter((c) => pathMatches(c.path, url.pathname))
      .sort((a, b) => b.path.length - a.path.length);
    return matching.length ? matching.map((c) => `${c.name}=${c.value}`).join('; ') : undefined;
  }

  private store(url: URL, setCookies: string[]): void {
    for (const line of setCookies) {
      const [pair = '', ...attributes] = line.split(';').map((s) => s.trim());
      const eq = pair.indexOf('=');
      if (eq <= 0) continue;
      const name = pair.slice(0, eq);
      const value = pair.slice(eq + 1);
      let path = url.pathname.replace(/\/[^/]*$/, '') || '/';
      let expired = value === '';
      for (const attribute of attributes) {
        const [key = '', ...rest] = attribute.split('=');
        const attrValue = rest.join('=');
        const lower = key.toLowerCase();
        if (lower === 'path' && attrValue.startsWith('/')) path = attrValue;
        if (lower === 'max-age' && Number(attrValue) <= 0) expired = true;
        if (lower === 'expires' && Date.parse(attrValue) <= Date.now()) expired = true;
      }
      const key = `${name};${path}`;
      if (expired) this.cookies.delete(key);
      else this.cookies.set(key, { name, value, path });
    }
  }

  async request(url: string, init: { method?: string; form?: Record<string, string>; headers?: Record<string, string> } = {}): Promise<Hop> {
    const target = new URL(url);
    const headers = new Headers(init.headers);
    const cookie = this.cookieHeader(target);
    if (cookie) headers.set('cookie', cookie);
    let body: string | undefined;
    if (init.form) {
      headers.set('content-type', 'application/x-www-form-urlencoded');
      body = new URLSearchParams(init.form).toString();
    }
    const response = await fetch(target, { method: init.method ?? (body ? 'POST' : 'GET'), headers, body, redirect: 'manual' });
    this.store(target, response.headers.getSetCookie());
    const location = response.headers.get('location');
    return {
      url: target.href,
      status: response.status,
      location: location ? new URL(location, target).href : undefined,
      body: await response.text(),
      headers: response.headers,
    };
  }

  /**
   * Follows redirects with GET from the given hop until a page answers without one, or until the
   * next location satisfies `stopAt` (that location is not requested). Returns every hop.
   */
  async follow(first: Hop, stopAt: (url: string) => boolean = () => false): Promise<{ hops: Hop[]; last: Hop; stoppedAt?: string }> {
    const hops = [first];
    let current = first;
    for (let i = 0; i < 20; i += 1) {
      const next = current.status >= 300 && current.status < 400 ? current.location : undefined;
      if (!next) return { hops, last: current };
      if (stopAt(next)) return { hops, last: current, stoppedAt: next };
      current = await this.request(next);
      hops.push(current);
    }
    throw new Error('More than 20 redirects');
  }
}

const ENTITIES: Record<string, string> = { '&amp;': '&', '&lt;': '<', '&gt;': '>', '&quot;': '"', '&#39;': "'", '&#96;': '`' };

export function unescapeHtml(value: string): string {
  return value.replace(/&(amp|lt|gt|quot|#39|#96);/g, (e) => ENTITIES[e] ?? e);
}

/** The first form of a page: its action (absolute) and hidden inputs. */
export function readForm(html: string, baseUrl: string): { action: string; method: string; hidden: Record<string, string> } {
  const form = /<form\b([^>]*)>([\s\S]*?)<\/form>/i.exec(html);
  if (!form) throw new Error('No form on the page');
  const attributes = form[1] ?? '';
  const action = /\baction="([^"]*)"/i.exec(attributes)?.[1] ?? '';
  const method = /\bmethod="([^"]*)"/i.exec(attributes)?.[1] ?? 'get';
  const hidden: Record<string, string> = {};
  for (const input of (form[2] ?? '').matchAll(/<input\b[^>]*type="hidden"[^>]*>/gi)) {
    const name = /\bname="([^"]*)"/i.exec(input[0])?.[1];
    const value = /\bvalue="([^"]*)"/i.exec(input[0])?.[1] ?? '';
    if (name) hidden[name] = unescapeHtml(value);
  }
  return { action: new URL(unescapeHtml(action), baseUrl).href, method: method.toLowerCase(), hidden };
}

/** The text of the page's alert, if any. */
export function alertText(html: string): string | undefined {
  const match = /<div class="alert" role="alert">([\s\S]*?)<\/div>/.exec(html);
  return match?.[1] === undefined ? undefined : unescapeHtml(match[1]);
}
