/**
 * A loopback stand-in for the hosted upload service, speaking the same protocol as the uploadthing SDK expects:
 * route metadata from the app, signed HEAD/PUT uploads from the browser, the completion callback to the app (as a
 * signed POST, or as JSON lines on the held metadata response when the app runs in development mode), the
 * callback result back, stored files served at /f/<key>, and UTApi's listFiles/deleteFiles.
 *
 * Started by the demo, `npm run dev` and the browser tests; production points UPLOADTHING_* at the real service.
 * Settings: UPLOADTHING_TOKEN (the same token as the app), UPLOAD_STANDIN_PORT (4010), UPLOAD_STANDIN_DIR
 * (./data/uploads).
 */
import http from "node:http";
import { createHash, createHmac, timingSafeEqual } from "node:crypto";
import { mkdirSync, readFileSync, writeFileSync, existsSync, rmSync, readdirSync } from "node:fs";
import { Readable } from "node:stream";
import path from "node:path";

interface Registration {
  metadata: unknown;
  isDev: boolean;
  callbackUrl: string;
  callbackSlug: string;
  awaitServerData: boolean;
  devStream?: http.ServerResponse;
  pendingKeys?: Set<string>;
}
interface StoredFile {
  key: string;
  name: string;
  size: number;
  type: string;
  customId: string | null;
  fileHash: string;
  uploadedAt: number;
}

/** Put a file straight into a stand-in folder, as if it had been uploaded (the demo seed uses this). */
export function storeFileInStandIn(dir: string, key: string, name: string, bytes: Uint8Array, type = "text/csv"): void {
  mkdirSync(dir, { recursive: true });
  writeFileSync(path.join(dir, key), bytes);
  const stored: StoredFile = { key, name, size: bytes.length, type, customId: null, fileHash: createHash("md5").update(bytes).digest("hex"), uploadedAt: 0 };
  writeFileSync(path.join(dir, `${key}.json`), JSON.stringify(stored));
}

export interface StandIn {
  url: string;
  close(): Promise<void>;
}

function decodeToken(token: string): { apiKey: string; appId: string } {
  const parsed = JSON.parse(Buffer.from(token, "base64").toString("utf8"));
  if (typeof parsed.apiKey !== "string" || !parsed.apiKey.startsWith("sk_")) throw new Error("UPLOADTHING_TOKEN: apiKey must start with sk_");
  return { apiKey: parsed.apiKey, appId: String(parsed.appId) };
}

const sign = (payload: string, apiKey: string) => `hmac-sha256=${createHmac("sha256", apiKey).update(payload).digest("hex")}`;

function sameSignature(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

async function readBody(req: http.IncomingMessage): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString("utf8");
}

/**
 * CORS only for the app's own pages: the origins named in UPLOAD_STANDIN_APP_ORIGINS / BALLAST_URL and those of the
 * callback addresses the app registers (it registers before any browser may send bytes). Never "*".
 */
const appOrigins = new Set<string>(
  [...(process.env.UPLOAD_STANDIN_APP_ORIGINS ?? "").split(","), process.env.BALLAST_URL ?? ""]
    .map((v) => v.trim())
    .filter(Boolean)
    .flatMap((v) => {
      try {
        return [new URL(v).origin];
      } catch {
        return [];
      }
    }),
);

/** Learn the app's origin from a callback address it registered with the API key. */
function rememberAppOrigin(callbackUrl: string): void {
  try {
    appOrigins.add(new URL(callbackUrl).origin);
  } catch {
    // not an address: nothing to learn
  }
}

/** The CORS headers for a request: the caller's origin echoed only when it is one of the app's. */
function corsFor(req: http.IncomingMessage): Record<string, string> {
  const origin = req.headers.origin;
  if (!origin || !appOrigins.has(origin)) return { vary: "Origin" };
  return {
    "access-control-allow-origin": origin,
    "access-control-allow-methods": "GET, HEAD, PUT, POST, OPTIONS",
    "access-control-allow-headers": "content-type, range, x-uploadthing-version, b3, traceparent, x-uploadthing-api-key",
    "access-control-expose-headers": "x-ut-range-start",
    vary: "Origin",
  };
}

/** Bytes a multipart body may carry beyond the file it declares (boundaries and part headers). */
const MULTIPART_OVERHEAD = 16 * 1024;

/** Each response's request, so that every answer carries that request's CORS headers. */
const requestOf = new WeakMap<http.ServerResponse, http.IncomingMessage>();

function json(res: http.ServerResponse, status: number, body: unknown) {
  const req = requestOf.get(res);
  // Refusals go to the log, so a browser test that fails on one says why.
  if (status >= 400) console.error(`[upload stand-in] ${status} ${req?.method ?? ""} ${(req?.url ?? "").split("?")[0]}: ${JSON.stringify(body)}`);
  res.writeHead(status, { ...(req ? corsFor(req) : {}), "content-type": "application/json" });
  res.end(JSON.stringify(body));
}

/** Start the stand-in on a port (0 = any free port). */
export async function startUploadStandIn(options: { token: string; port?: number; dir: string; host?: string }): Promise<StandIn> {
  const { apiKey } = decodeToken(options.token);
  mkdirSync(options.dir, { recursive: true });
  const registrations = new Map<string, Registration>();
  const callbackWaiters = new Map<string, (result: { callbackData?: unknown; error?: string }) => void>();
  const host = options.host ?? "127.0.0.1";
  let base = "";

  const sidecar = (key: string) => path.join(options.dir, `${key}.json`);
  const blob = (key: string) => path.join(options.dir, key);
  const safeKey = (key: string) => /^[A-Za-z0-9_-]{1,128}$/.test(key);
  const fileData = (f: StoredFile) => ({
    name: f.name,
    size: f.size,
    type: f.type,
    customId: f.customId,
    key: f.key,
    url: `${base}/f/${f.key}`,
    appUrl: `${base}/f/${f.key}`,
    ufsUrl: `${base}/f/${f.key}`,
    fileHash: f.fileHash,
  });

  async function waitForRegistration(key: string): Promise<Registration | undefined> {
    for (let i = 0; i < 100 && !registrations.has(key); i++) await new Promise((r) => setTimeout(r, 50));
    return registrations.get(key);
  }

  async function deliverCallback(reg: Registration, stored: StoredFile): Promise<void> {
    const body = JSON.stringify({ status: "uploaded", file: fileData(stored), origin: base, metadata: reg.metadata });
    const signature = sign(body, apiKey);
    if (reg.isDev && reg.devStream) {
      reg.devStream.write(JSON.stringify({ payload: body, signature, hook: "callback" }) + "\n");
      reg.pendingKeys?.delete(stored.key);
      if (reg.pendingKeys?.size === 0) reg.devStream.end();
      return;
    }
    const url = new URL(reg.callbackUrl);
    if (!url.searchParams.has("slug")) url.searchParams.set("slug", reg.callbackSlug);
    const response = await fetch(url, {
      method: "POST",
      headers: { "content-type": "application/json", "uploadthing-hook": "callback", "x-uploadthing-signature": signature },
      body,
    });
    if (!response.ok) throw new Error(`the app answered the upload callback with ${response.status}`);
  }

  const server = http.createServer(async (req, res) => {
    try {
      requestOf.set(res, req);
      const url = new URL(req.url ?? "/", base || "http://127.0.0.1");
      if (req.method === "OPTIONS") {
        res.writeHead(204, corsFor(req));
        return res.end();
      }
      // A browser on another site gets no CORS headers; its writes are refused outright.
      if (req.headers.origin && !appOrigins.has(req.headers.origin) && req.method !== "GET" && req.method !== "HEAD") {
        return json(res, 403, { error: "this upload service answers only Ballast's own pages" });
      }

      if (req.method === "POST" && (url.pathname === "/route-metadata" || url.pathname.startsWith("/v6/") || url.pathname === "/callback-result")) {
        const key = req.headers["x-uploadthing-api-key"];
        if (key !== apiKey) return json(res, 401, { error: "invalid api key" });
      }

      if (req.method === "POST" && url.pathname === "/route-metadata") {
        const body = JSON.parse(await readBody(req));
        const reg: Registration = {
          metadata: body.metadata ?? {},
          isDev: Boolean(body.isDev),
          callbackUrl: String(body.callbackUrl),
          callbackSlug: String(body.callbackSlug),
          // (the registration is authenticated by the API key: its callback names the app's origin)
          awaitServerData: body.awaitServerData !== false,
        };
        rememberAppOrigin(reg.callbackUrl);
        for (const fileKey of body.fileKeys ?? []) registrations.set(String(fileKey), reg);
        if (reg.isDev) {
          reg.devStream = res;
          reg.pendingKeys = new Set((body.fileKeys ?? []).map(String));
          res.writeHead(200, { "content-type": "application/x-ndjson" });
          res.flushHeaders();
          return;
        }
        return json(res, 200, { ok: true });
      }

      if (req.method === "POST" && url.pathname === "/callback-result") {
        const body = JSON.parse(await readBody(req));
        callbackWaiters.get(String(body.fileKey))?.({ callbackData: body.callbackData, error: body.error });
        callbackWaiters.delete(String(body.fileKey));
        return json(res, 200, { ok: true });
      }

      if (req.method === "POST" && url.pathname === "/v6/listFiles") {
        const files = readdirSync(options.dir)
          .filter((f) => f.endsWith(".json"))
          .map((f) => JSON.parse(readFileSync(path.join(options.dir, f), "utf8")) as StoredFile)
          .map((f) => ({ id: f.key, key: f.key, name: f.name, size: f.size, customId: f.customId, status: "Uploaded", uploadedAt: f.uploadedAt }));
        return json(res, 200, { hasMore: false, files });
      }

      if (req.method === "POST" && url.pathname === "/v6/deleteFiles") {
        const body = JSON.parse(await readBody(req));
        let deletedCount = 0;
        for (const key of body.fileKeys ?? []) {
          if (!safeKey(String(key)) || !existsSync(sidecar(String(key)))) continue;
          rmSync(sidecar(String(key)));
          rmSync(blob(String(key)), { force: true });
          deletedCount++;
        }
        return json(res, 200, { success: true, deletedCount });
      }

      if ((req.method === "GET" || req.method === "HEAD") && url.pathname.startsWith("/f/")) {
        const key = url.pathname.slice(3);
        if (!safeKey(key) || !existsSync(sidecar(key))) return json(res, 404, { error: "not found" });
        const meta = JSON.parse(readFileSync(sidecar(key), "utf8")) as StoredFile;
        res.writeHead(200, { ...corsFor(req), "content-type": meta.type || "application/octet-stream", "content-length": meta.size });
        return req.method === "HEAD" ? res.end() : res.end(readFileSync(blob(key)));
      }

      // Signed upload URLs: /<key>?expires=…&x-ut-…&signature=hmac-sha256=…
      const key = url.pathname.slice(1);
      if ((req.method === "HEAD" || req.method === "PUT") && safeKey(key)) {
        const raw = `${base}${req.url}`;
        const at = raw.indexOf("&signature=");
        const given = at >= 0 ? decodeURIComponent(raw.slice(at + "&signature=".length)) : "";
        if (at < 0 || !sameSignature(sign(raw.slice(0, at), apiKey), given)) return json(res, 403, { error: "invalid signature" });
        if (Number(url.searchParams.get("expires")) < Date.now()) return json(res, 403, { error: "upload URL expired" });
        if (req.method === "HEAD") {
          res.writeHead(200, { ...corsFor(req), "x-ut-range-start": "0" });
          return res.end();
        }
        // The signed URL states the file's size; more bytes than that are refused, counted as they arrive.
        const declared = Number(url.searchParams.get("x-ut-file-size"));
        if (!Number.isSafeInteger(declared) || declared < 0) return json(res, 400, { error: "the upload URL does not state the file's size" });
        const limit = declared + MULTIPART_OVERHEAD;
        if (Number(req.headers["content-length"] ?? 0) > limit) return json(res, 413, { error: `the file is larger than the ${declared} bytes declared` });
        let received = 0;
        const capped = Readable.from(
          (async function* () {
            for await (const chunk of req) {
              received += (chunk as Buffer).length;
              if (received > limit) throw new RangeError("larger than declared");
              yield chunk as Buffer;
            }
          })(),
        );
        const request = new Request(`${base}${req.url}`, {
          method: "PUT",
          headers: req.headers as Record<string, string>,
          body: Readable.toWeb(capped) as ReadableStream,
          duplex: "half",
        } as RequestInit);
        let form: FormData;
        try {
          form = await request.formData();
        } catch {
          if (received > limit) return json(res, 413, { error: `the file is larger than the ${declared} bytes declared` });
          return json(res, 400, { error: "the upload body could not be read" });
        }
        const file = form.get("file");
        if (!(file instanceof Blob)) return json(res, 400, { error: "multipart field 'file' missing" });
        if (file.size !== declared) return json(res, file.size > declared ? 413 : 400, { error: `the file has ${file.size} bytes, not the ${declared} declared` });
        const bytes = Buffer.from(await file.arrayBuffer());
        const decode = (name: string) => decodeURIComponent(url.searchParams.get(name) ?? "");
        const stored: StoredFile = {
          key,
          name: decode("x-ut-file-name"),
          size: bytes.length,
          type: decode("x-ut-file-type") || (file as File).type || "application/octet-stream",
          customId: decode("x-ut-custom-id") || null,
          fileHash: createHash("md5").update(bytes).digest("hex"),
          uploadedAt: Date.now(),
        };
        writeFileSync(blob(key), bytes);
        writeFileSync(sidecar(key), JSON.stringify(stored));
        const reg = await waitForRegistration(key);
        if (!reg) return json(res, 200, { ...fileData(stored), serverData: null, error: "the app never registered this upload" });
        const result = reg.awaitServerData
          ? new Promise<{ callbackData?: unknown; error?: string }>((resolve) => {
              callbackWaiters.set(key, resolve);
              setTimeout(() => resolve({ error: "the app did not finish processing the upload in time" }), 120_000).unref();
            })
          : Promise.resolve<{ callbackData?: unknown; error?: string }>({ callbackData: null });
        try {
          await deliverCallback(reg, stored);
        } catch (error) {
          callbackWaiters.delete(key);
          return json(res, 200, { error: error instanceof Error ? error.message : "callback failed" });
        }
        const outcome = await result;
        registrations.delete(key);
        if (outcome.error) return json(res, 200, { error: outcome.error });
        return json(res, 200, { url: `${base}/f/${key}`, appUrl: `${base}/f/${key}`, ufsUrl: `${base}/f/${key}`, fileHash: stored.fileHash, serverData: outcome.callbackData ?? null });
      }

      if (req.method === "GET" && url.pathname === "/health") return json(res, 200, { ok: true });
      json(res, 404, { error: "not found" });
    } catch (error) {
      if (!res.headersSent) json(res, 500, { error: error instanceof Error ? error.message : "stand-in error" });
      else res.end();
    }
  });
  server.requestTimeout = 0;
  await new Promise<void>((resolve) => server.listen(options.port ?? 4010, host, resolve));
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : options.port;
  base = `http://${host}:${port}`;
  return {
    url: base,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  const token = process.env.UPLOADTHING_TOKEN;
  if (!token) {
    console.error("upload stand-in: UPLOADTHING_TOKEN is not set");
    process.exit(1);
  }
  startUploadStandIn({ token, port: Number(process.env.UPLOAD_STANDIN_PORT ?? 4010), dir: process.env.UPLOAD_STANDIN_DIR ?? "data/uploads" }).then((s) =>
    console.log(`upload stand-in listening on ${s.url}`),
  );
}
