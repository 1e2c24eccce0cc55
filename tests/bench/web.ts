/** Helpers of the benches that drive the production web tier over HTTP: sign-in, waiting for it, quantiles. */
import { DEMO_PASSWORD } from "../../db/seed";

/** Sign in through Auth.js's credentials flow; the whole cookie jar (session and CSRF cookies), as a browser keeps it. */
export async function signIn(base: string, email: string): Promise<string> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const jar = (csrf.headers.getSetCookie?.() ?? []).map((c) => c.split(";")[0]);
  const { csrfToken } = await csrf.json();
  const response = await fetch(`${base}/api/auth/callback/credentials`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: jar.join("; ") },
    body: new URLSearchParams({ csrfToken, email, password: DEMO_PASSWORD, callbackUrl: `${base}/home` }),
    redirect: "manual",
  });
  const cookies = [...jar, ...(response.headers.getSetCookie?.() ?? []).map((c) => c.split(";")[0])];
  if (!cookies.some((c) => c.startsWith("authjs.session-token="))) throw new Error(`sign-in failed for ${email} (${response.status})`);
  return cookies.join("; ");
}

/** Wait until a URL answers 2xx, polling every 250 ms, for at most `seconds`. */
export async function waitFor(url: string, seconds: number): Promise<void> {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) throw new Error(`${url} did not answer within ${seconds} s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** The p-quantile of sorted values (nearest rank). */
export function quantile(sorted: readonly number[], p: number): number {
  return sorted.length ? sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1))] : NaN;
}
