// A tiny browser stand-in for integration tests: a cookie jar, same-origin form posts, manual redirects.
import { APP_URL } from "./env";

export class Client {
  private cookies = new Map<string, string>();
  constructor(readonly base = APP_URL) {}

  cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  get sessionCookie() {
    return this.cookies.get("countersign_session");
  }

  private remember(res: Response) {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const eq = pair!.indexOf("=");
      const name = pair!.slice(0, eq);
      const value = pair!.slice(eq + 1);
      if (/Max-Age=0|Expires=Thu, 01 Jan 1970/i.test(line) || value === "") this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  async request(path: string, init: RequestInit & { origin?: string | null } = {}) {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set("cookie", this.cookieHeader());
    const method = (init.method ?? "GET").toUpperCase();
    if (method !== "GET" && init.origin !== null) headers.set("origin", init.origin ?? this.base);
    const res = await fetch(new URL(path, this.base), { ...init, headers, redirect: "manual" });
    this.remember(res);
    return res;
  }

  get(path: string, init: RequestInit = {}) {
    return this.request(path, init);
  }

  post(path: string, fields: Record<string, string>, init: RequestInit & { origin?: string | null } = {}) {
    return this.request(path, { ...init, method: "POST", body: new URLSearchParams(fields) });
  }

  async json<T = any>(path: string): Promise<{ status: number; body: T }> {
    const res = await this.get(path, { headers: { accept: "application/json" } });
    return { status: res.status, body: (await res.json()) as T };
  }

  async signIn(email: string, password: string) {
    const res = await this.post("/sign-in", { email, password });
    if (res.status !== 302) throw new Error(`sign-in failed for ${email}: ${res.status}`);
    return res;
  }
}

/** A page's HTML with React's text-joining comments removed, for plain `toContain` checks. */
export async function pageText(res: Response) {
  return (await res.text()).replace(/<!-- -->/g, "");
}

let counter = 0;
export function uniqueEmail(tag = "person") {
  return `${tag}-${Date.now().toString(36)}-${(counter++).toString(36)}@test.example`;
}
