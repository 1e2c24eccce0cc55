import { afterAll, beforeAll, describe, expect, it } from "vitest";
import http from "node:http";
import net from "node:net";
import { createHmac } from "node:crypto";
import { mkdtempSync, readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { startUploadStandIn, type StandIn } from "@/scripts/upload-standin";

/**
 * The loopback upload stand-in, spoken to as the uploadthing SDK does (the URL signing below follows the SDK's
 * generateSignedURL: values URL-encoded before URLSearchParams encodes them again, HMAC-SHA256 over the URL).
 */
const apiKey = "sk_test_standin";
const token = Buffer.from(JSON.stringify({ apiKey, appId: "app", regions: ["local"] })).toString("base64");
const hmac = (payload: string) => `hmac-sha256=${createHmac("sha256", apiKey).update(payload).digest("hex")}`;
let standIn: StandIn;
let dir: string;
let app: http.Server;
let appUrl: string;
const callbacks: { body: string; signature: string | undefined }[] = [];

function signedUrl(key: string, name: string, expires = Date.now() + 60_000, size = 5): string {
  const url = new URL(`${standIn.url}/${key}`);
  url.searchParams.append("expires", String(expires));
  for (const [k, v] of Object.entries({ "x-ut-identifier": "app", "x-ut-file-name": name, "x-ut-file-size": String(size), "x-ut-file-type": "text/csv", "x-ut-slug": "positions" })) {
    url.searchParams.append(k, encodeURIComponent(v));
  }
  url.searchParams.append("signature", hmac(url.toString()));
  return url.href;
}

function multipart(content: string, name: string): { body: Blob; type: string } {
  const boundary = "----ballast-test";
  const body = new Blob([`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\n${content}\r\n--${boundary}--\r\n`]);
  return { body, type: `multipart/form-data; boundary=${boundary}` };
}

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "ballast-standin-"));
  standIn = await startUploadStandIn({ token, port: 0, dir });
  // A stand-in for the app's upload route: records the callback, then reports a result as the SDK does.
  app = http.createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const body = Buffer.concat(chunks).toString();
    callbacks.push({ body, signature: req.headers["x-uploadthing-signature"] as string | undefined });
    res.end("null");
    const parsed = JSON.parse(body);
    await fetch(`${parsed.origin}/callback-result`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-uploadthing-api-key": apiKey },
      body: JSON.stringify({ fileKey: parsed.file.key, callbackData: { uploadId: "u-1" } }),
    });
  });
  await new Promise<void>((r) => app.listen(0, "127.0.0.1", r));
  appUrl = `http://127.0.0.1:${(app.address() as net.AddressInfo).port}/api/uploadthing`;
});

afterAll(async () => {
  await standIn.close();
  await new Promise((r) => app.close(r));
});

describe("upload service stand-in", () => {
  it("refuses route metadata without the API key", async () => {
    const response = await fetch(`${standIn.url}/route-metadata`, { method: "POST", body: "{}" });
    expect(response.status).toBe(401);
  });

  it("refuses an upload URL with a wrong signature or past its expiry, storing nothing", async () => {
    const forged = signedUrl("key-forged", "a.csv").replace(/signature=[^&]+/, "signature=hmac-sha256%3Ddeadbeef");
    const { body, type } = multipart("a,b\n", "a.csv");
    expect((await fetch(forged, { method: "PUT", body, headers: { "content-type": type } })).status).toBe(403);
    const expired = signedUrl("key-expired", "a.csv", Date.now() - 1000);
    expect((await fetch(expired, { method: "PUT", body, headers: { "content-type": type } })).status).toBe(403);
    expect(readdirSync(dir)).toEqual([]);
  });

  it("stores nothing when the browser goes away mid-upload", async () => {
    const url = new URL(signedUrl("key-aborted", "big.csv"));
    const { type } = multipart("", "big.csv");
    await new Promise<void>((resolve) => {
      const socket = net.connect(Number(url.port), url.hostname, () => {
        socket.write(`PUT ${url.pathname}${url.search} HTTP/1.1\r\nHost: ${url.host}\r\nContent-Type: ${type}\r\nContent-Length: 100000\r\n\r\n------ballast-test\r\nContent-Disposition: form-data; name="file"; filename="big.csv"\r\n\r\npartial`);
        setImmediate(() => {
          socket.destroy();
          resolve();
        });
      });
    });
    // Give the server a turn to notice the closed connection.
    await fetch(`${standIn.url}/health`);
    expect(readdirSync(dir).filter((f) => f.startsWith("key-aborted"))).toEqual([]);
  });

  it("takes a signed upload, calls the app back with a valid signature, and returns the app's result", async () => {
    const key = "key-complete";
    const metadata = await fetch(`${standIn.url}/route-metadata`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-uploadthing-api-key": apiKey },
      body: JSON.stringify({ fileKeys: [key], metadata: { firmId: "f" }, isDev: false, callbackUrl: appUrl, callbackSlug: "positions", awaitServerData: true }),
    });
    expect(await metadata.json()).toEqual({ ok: true });
    const head = await fetch(signedUrl(key, "good file.csv"), { method: "HEAD" });
    expect(head.headers.get("x-ut-range-start")).toBe("0");
    const { body, type } = multipart("a,b\n1,2\n", "good file.csv");
    const response = await fetch(signedUrl(key, "good file.csv", undefined, 8), { method: "PUT", body, headers: { "content-type": type } });
    const reply = await response.json();
    expect(reply).toMatchObject({ ufsUrl: `${standIn.url}/f/${key}`, serverData: { uploadId: "u-1" } });
    expect(reply.error).toBeUndefined();
    const [callback] = callbacks;
    expect(callback.signature).toBe(hmac(callback.body));
    expect(JSON.parse(callback.body)).toMatchObject({ status: "uploaded", file: { key, name: "good file.csv", size: 8 }, metadata: { firmId: "f" } });
    expect(await (await fetch(`${standIn.url}/f/${key}`)).text()).toBe("a,b\n1,2\n");
  });

  it("refuses more bytes than the signed URL declares, storing nothing, and answers CORS only for the app's origin", async () => {
    const key = "key-too-big";
    const headers = { "content-type": "application/json", "x-uploadthing-api-key": apiKey };
    await fetch(`${standIn.url}/route-metadata`, { method: "POST", headers, body: JSON.stringify({ fileKeys: [key], metadata: {}, isDev: false, callbackUrl: appUrl, callbackSlug: "positions" }) });
    const { body, type } = multipart("0123456789".repeat(10), "big.csv");
    const response = await fetch(signedUrl(key, "big.csv", undefined, 5), { method: "PUT", body, headers: { "content-type": type } });
    expect(response.status).toBe(413);
    expect((await response.json()).error).toContain("5 declared");
    expect(readdirSync(dir).filter((f) => f.startsWith(key))).toEqual([]);
    // A stream far past the declared size is cut off as it arrives (no Content-Length to go by).
    const huge = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(new TextEncoder().encode(`------ballast-test\r\nContent-Disposition: form-data; name="file"; filename="big.csv"\r\n\r\n`));
        for (let i = 0; i < 64; i++) controller.enqueue(new Uint8Array(64 * 1024));
        controller.close();
      },
    });
    const streamed = await fetch(signedUrl(key, "big.csv", undefined, 5), { method: "PUT", body: huge, headers: { "content-type": type }, duplex: "half" } as RequestInit);
    expect(streamed.status).toBe(413);
    expect(readdirSync(dir).filter((f) => f.startsWith(key))).toEqual([]);
    // CORS: the app's origin (learnt from its registered callback) is echoed; another site gets none, and no "*".
    const appOrigin = new URL(appUrl).origin;
    const own = await fetch(signedUrl(key, "big.csv"), { method: "OPTIONS", headers: { origin: appOrigin } });
    expect(own.headers.get("access-control-allow-origin")).toBe(appOrigin);
    const foreign = await fetch(signedUrl(key, "big.csv"), { method: "OPTIONS", headers: { origin: "https://evil.example" } });
    expect(foreign.headers.get("access-control-allow-origin")).toBeNull();
    const foreignPut = await fetch(signedUrl(key, "big.csv"), { method: "PUT", body: multipart("a,b\n", "a.csv").body, headers: { "content-type": type, origin: "https://evil.example" } });
    expect(foreignPut.status).toBe(403);
  });

  it("lists and deletes stored files for the server SDK", async () => {
    const headers = { "content-type": "application/json", "x-uploadthing-api-key": apiKey };
    const listed = await (await fetch(`${standIn.url}/v6/listFiles`, { method: "POST", headers, body: "{}" })).json();
    expect(listed.files.map((f: { key: string }) => f.key)).toContain("key-complete");
    const deleted = await (await fetch(`${standIn.url}/v6/deleteFiles`, { method: "POST", headers, body: JSON.stringify({ fileKeys: ["key-complete"] }) })).json();
    expect(deleted).toEqual({ success: true, deletedCount: 1 });
    expect((await fetch(`${standIn.url}/f/key-complete`)).status).toBe(404);
  });
});

describe("when the upload service is down", () => {
  it("says so plainly, so the person can retry; nothing is stored", async () => {
    const { fetchStoredFile } = await import("@/lib/uploads/file-store");
    // Port 9 (discard) on loopback has no listener here: the connection is refused.
    await expect(fetchStoredFile("http://127.0.0.1:9/f/anything")).rejects.toMatchObject({
      kind: "unavailable",
      message: "The file store is not answering. Nothing was changed; try again in a moment.",
    });
  });
});
