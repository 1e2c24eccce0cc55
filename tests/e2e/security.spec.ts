import { test, expect, request as playwrightRequest, type APIRequestContext, type Page } from "@playwright/test";
import { readdirSync, readFileSync, statSync, existsSync } from "node:fs";
import { randomUUID } from "node:crypto";
import path from "node:path";
import { ROUTES, type RouteCase } from "../permission-table";
import { BASE_URL, databaseSnapshot, DEMO_PASSWORD, DEMO_USERS, signedInApi, signInThroughPage } from "./helpers";

/** Collect the browser's reports of content-security-policy violations on a page. */
function watchViolations(page: Page): string[] {
  const violations: string[] = [];
  page.on("console", (message) => {
    const text = message.text();
    if (/Content Security Policy|Refused to (load|execute|apply|connect)/i.test(text)) violations.push(`${page.url()}: ${text}`);
  });
  return violations;
}

test("every page carries the security headers and passes its own content security policy", async ({ page }) => {
  const violations = watchViolations(page);
  for (const url of ["/", "/sign-in"]) {
    const response = await page.goto(url);
    const headers = response!.headers();
    expect(headers["content-security-policy"]).toContain("frame-ancestors 'none'");
    expect(headers["content-security-policy"]).toMatch(/script-src 'self' 'nonce-[^']+' 'strict-dynamic'/);
    expect(headers["x-content-type-options"]).toBe("nosniff");
    expect(headers["referrer-policy"]).toBe("strict-origin-when-cross-origin");
    expect(headers["x-frame-options"]).toBe("DENY");
  }
  await signInThroughPage(page, DEMO_USERS[0].email);
  for (const link of ["Data", "Periods", "Calendar", "Settings", "Audit trail", "This month"]) {
    await page.getByRole("navigation", { name: "Month end" }).getByRole("link", { name: link }).click();
    await expect(page.locator("h1")).toBeVisible();
  }
  await page.goto("/periods");
  await page.getByRole("link", { name: "November 2026" }).click();
  await page.getByRole("link", { name: "Data-quality report" }).click();
  await expect(page.locator("h1")).toHaveText("Data-quality report");
  // A fresh nonce each time.
  const first = (await page.request.get("/sign-in")).headers()["content-security-policy"];
  const second = (await page.request.get("/sign-in")).headers()["content-security-policy"];
  expect(first).not.toBe(second);
  expect(violations).toEqual([]);
});

test("no secret reaches the browser's files", () => {
  const secrets = [process.env.E2E_AUTH_SECRET, process.env.E2E_UPLOADTHING_TOKEN].filter((s): s is string => Boolean(s));
  if (existsSync(".env.local")) {
    for (const line of readFileSync(".env.local", "utf8").split("\n")) {
      const [key, ...rest] = line.split("=");
      if (/SECRET|TOKEN|PASS/.test(key ?? "") && rest.join("=").length >= 8) secrets.push(rest.join("="));
    }
  }
  const apiKey = process.env.E2E_UPLOADTHING_TOKEN ? JSON.parse(Buffer.from(process.env.E2E_UPLOADTHING_TOKEN, "base64").toString()).apiKey : null;
  if (apiKey) secrets.push(apiKey);
  const files: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const full = path.join(dir, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (/\.(js|css|html|json|map)$/.test(name)) files.push(full);
    }
  };
  walk(path.join(process.env.NEXT_DIST_DIR ?? ".next", "static"));
  expect(files.length).toBeGreaterThan(5);
  for (const file of files) {
    const text = readFileSync(file, "utf8");
    for (const secret of secrets) expect(text.includes(secret), `${file} contains a secret`).toBe(false);
    expect(text, file).not.toMatch(/AUTH_SECRET|UPLOADTHING_TOKEN|REMINDERS_SECRET|DATABASE_AUTH_TOKEN/);
  }
});

/** Every table but the sign-in log (signing the personas in writes it) and any named, for "nothing changed" checks. */
function personaFor(route: RouteCase): string {
  const user =
    route.allowed === "public" || route.allowed === "member"
      ? DEMO_USERS[0]
      : DEMO_USERS.find((u) => u.roles.some((r) => (route.allowed as readonly string[]).includes(r)));
  return user!.email;
}

test("every write route refuses a request from another origin, even from a signed-in person, and changes nothing", async () => {
  const admin = await signedInApi(DEMO_USERS[0].email);
  const ids: Record<string, string> = {
    periodId: (await (await admin.get("/api/periods")).json()).periods[0].id,
    memberId: (await (await admin.get("/api/members")).json()).members.find((m: { email: string }) => m.email === DEMO_USERS[4].email).id,
    uploadId: (await (await admin.get("/api/uploads")).json()).uploads[0]?.id,
    methodId: (await (await admin.get("/api/method")).json()).versions[0]?.id,
  };
  await admin.dispose();
  const writes = ROUTES.filter((r) => !r.external && r.method !== "GET");
  expect(writes.length).toBeGreaterThan(20);
  const apis = new Map<string, APIRequestContext>();
  const failures: string[] = [];
  const before = await databaseSnapshot();
  // Another port of the same host (same site, so a Lax cookie would still travel), another host, an opaque origin.
  const foreign: Record<string, string>[] = [
    { origin: BASE_URL.replace(/:\d+$/, ":4999"), "sec-fetch-site": "same-site" },
    { origin: "https://evil.example", "sec-fetch-site": "cross-site" },
    { origin: "null" },
  ];
  for (const route of writes) {
    const email = personaFor(route);
    if (!apis.has(email)) apis.set(email, await signedInApi(email));
    const url = route.path.replace(/\[(\w+)\]/g, (_m, name: string) => ids[name] ?? randomUUID());
    for (const headers of foreign) {
      const response = await apis.get(email)!.fetch(url, { method: route.method, headers, data: route.validBody ?? route.invalidBody ?? {} });
      const body = await response.json().catch(() => null);
      if (response.status() !== 403 || body?.error?.code !== "forbidden:origin") {
        failures.push(`${route.method} ${route.path} from ${headers.origin}: ${response.status()} ${JSON.stringify(body).slice(0, 120)}`);
      }
    }
  }
  expect(await databaseSnapshot()).toBe(before);
  for (const api of apis.values()) await api.dispose();
  expect(failures).toEqual([]);
});

test("a text/plain form post that would add an administrator is refused, from another port and from none", async () => {
  const admin = await signedInApi(DEMO_USERS[0].email);
  const before = await databaseSnapshot();
  const payload = JSON.stringify({ name: "Mallory Vane", email: "mallory@evil.example", roles: ["admin", "compliance_head"], password: "attacker-chosen-pass-1" });
  const crossPort = await admin.fetch("/api/members", {
    method: "POST",
    headers: { "content-type": "text/plain", origin: BASE_URL.replace(/:\d+$/, ":4999"), "sec-fetch-site": "same-site" },
    data: Buffer.from(payload),
  });
  expect(crossPort.status()).toBe(403);
  const plain = await admin.fetch("/api/members", { method: "POST", headers: { "content-type": "text/plain" }, data: Buffer.from(payload) });
  expect(plain.status()).toBe(415);
  expect((await plain.json()).error.message).toContain("application/json");
  expect(await databaseSnapshot()).toBe(before);
  const members = (await (await admin.get("/api/members")).json()).members as { email: string }[];
  expect(members.some((m) => m.email === "mallory@evil.example")).toBe(false);
  await admin.dispose();
});

test("after sign-in a hostile next address stays on this site", async ({ browser }) => {
  const before = await databaseSnapshot({ ignore: ["audit_events", "users"] });
  for (const next of ["/%5Cevil.example/phish", "/%09/evil.example", "//evil.example", "https://evil.example/", "/%0d%0a/evil.example"]) {
    // a fresh context per address: clearing cookies can race a response of the page before that sets them again
    const context = await browser.newContext({ baseURL: BASE_URL });
    const page = await context.newPage();
    await page.goto(`/sign-in?next=${next}`);
    await page.getByLabel("E-mail").fill(DEMO_USERS[4].email);
    await page.getByLabel("Password").fill(DEMO_PASSWORD);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL((url) => url.pathname !== "/sign-in");
    const landed = new URL(page.url());
    expect(landed.origin, next).toBe(BASE_URL);
    expect(landed.pathname, next).toBe("/home");
    await context.close();
  }
  // Signing in writes its own log and session rows only; nothing else changed.
  expect(await databaseSnapshot({ ignore: ["audit_events", "users"] })).toBe(before);
});

test("signing out through the sign-in service's own route ends the session on the server", async () => {
  const api = await signedInApi(DEMO_USERS[4].email);
  const copied = await api.storageState();
  const { csrfToken } = await (await api.get("/api/auth/csrf")).json();
  const out = await api.post("/api/auth/signout", { form: { csrfToken, callbackUrl: `${BASE_URL}/sign-in` }, maxRedirects: 0 });
  expect([200, 302]).toContain(out.status());
  await api.dispose();
  // A copy of the session cookie taken before signing out no longer opens anything.
  const thief = await playwrightRequest.newContext({ baseURL: BASE_URL, storageState: copied });
  expect((await thief.get("/api/firm")).status()).toBe(401);
  await thief.dispose();
});

test("malformed addresses answer 404, not a server error, and HSTS is sent only over HTTPS", async () => {
  const api = await signedInApi(DEMO_USERS[0].email);
  const before = await databaseSnapshot();
  for (const url of ["/data/uploads/%%%", "/data/uploads/not-an-id", "/periods/%E0%A4%A", "/api/uploads/%%%", "/api/periods/not-a-uuid"]) {
    const response = await api.get(url, { maxRedirects: 0 });
    expect(response.status(), url).toBe(404);
  }
  const plain = await api.get("/sign-in");
  expect(plain.headers()["strict-transport-security"]).toBeUndefined();
  const tls = await api.get("/sign-in", { headers: { "x-forwarded-proto": "https" } });
  expect(tls.headers()["strict-transport-security"]).toMatch(/max-age=\d{7,}/);
  expect(await databaseSnapshot()).toBe(before);
  await api.dispose();
});
