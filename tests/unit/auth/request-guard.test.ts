import { describe, expect, it } from "vitest";
import { assertSameOrigin, isJsonContentType, MAX_JSON_BODY_BYTES, readJsonBody } from "@/lib/auth/request-guard";
import { AppError } from "@/lib/errors";

const APP = "http://localhost:3100";

function req(method: string, headers: Record<string, string>, body?: BodyInit): Request {
  return new Request(`${APP}/api/members`, { method, headers, body, ...(body instanceof ReadableStream ? { duplex: "half" } : {}) } as RequestInit);
}

function codeOf(fn: () => unknown): string | null {
  try {
    fn();
    return null;
  } catch (error) {
    return error instanceof AppError ? error.code : "other";
  }
}

async function asyncCodeOf(promise: Promise<unknown>): Promise<string | null> {
  try {
    await promise;
    return null;
  } catch (error) {
    return error instanceof AppError ? `${error.code} ${error.status}` : "other";
  }
}

describe("same-origin check on writes", () => {
  it.each([
    ["another port of the same host", { origin: "http://localhost:4000" }],
    ["another host", { origin: "https://evil.example" }],
    ["an opaque origin", { origin: "null" }],
    ["same-site but not same-origin", { "sec-fetch-site": "same-site" }],
    ["cross-site", { "sec-fetch-site": "cross-site", origin: APP }],
    ["the scheme differs", { origin: "https://localhost:3100" }],
  ])("refuses a write from %s with 403", (_label, headers) => {
    for (const method of ["POST", "PATCH", "PUT", "DELETE"]) expect(codeOf(() => assertSameOrigin(req(method, headers), {}))).toBe("forbidden:origin");
  });

  it("lets the app's own pages, typed addresses and non-browser clients through, and every read", () => {
    expect(codeOf(() => assertSameOrigin(req("POST", { origin: APP, "sec-fetch-site": "same-origin" }), {}))).toBeNull();
    expect(codeOf(() => assertSameOrigin(req("POST", { "sec-fetch-site": "none" }), {}))).toBeNull();
    expect(codeOf(() => assertSameOrigin(req("POST", {}), {}))).toBeNull();
    expect(codeOf(() => assertSameOrigin(req("GET", { origin: "https://evil.example", "sec-fetch-site": "cross-site" }), {}))).toBeNull();
  });

  it("accepts the public origin named in BALLAST_ORIGINS behind a proxy, and nothing else", () => {
    const env = { BALLAST_ORIGINS: "https://ballast.example.com, not a url" };
    expect(codeOf(() => assertSameOrigin(req("POST", { origin: "https://ballast.example.com" }), env))).toBeNull();
    expect(codeOf(() => assertSameOrigin(req("POST", { origin: "https://ballast.example.com.evil.example" }), env))).toBe("forbidden:origin");
  });
});

describe("JSON bodies", () => {
  it("names JSON content types", () => {
    expect(isJsonContentType("application/json")).toBe(true);
    expect(isJsonContentType("Application/JSON; charset=utf-8")).toBe(true);
    for (const t of [null, "", "text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x", "application/jsonp", "text/json"]) {
      expect(isJsonContentType(t), String(t)).toBe(false);
    }
  });

  it("refuses a body that is not declared JSON with 415", async () => {
    expect(await asyncCodeOf(readJsonBody(req("POST", { "content-type": "text/plain" }, '{"email":"x@y.z"}')))).toBe("unsupported_media:body 415");
    expect(await asyncCodeOf(readJsonBody(req("POST", {}, '{"email":"x@y.z"}')))).toBe("unsupported_media:body 415");
  });

  it("refuses a body over the limit with 413, whether it declares its length or not", async () => {
    const big = "x".repeat(MAX_JSON_BODY_BYTES + 1);
    expect(await asyncCodeOf(readJsonBody(req("POST", { "content-type": "application/json" }, JSON.stringify({ big }))))).toBe("too_large:body 413");
    // A streamed body with no Content-Length: cut off as it is read.
    const chunk = new TextEncoder().encode("[" + "1,".repeat(32 * 1024));
    let sent = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (sent > 20 * 1024 * 1024) controller.close();
        else {
          sent += chunk.byteLength;
          controller.enqueue(chunk);
        }
      },
    });
    expect(await asyncCodeOf(readJsonBody(req("POST", { "content-type": "application/json" }, stream)))).toBe("too_large:body 413");
    expect(sent).toBeLessThan(2 * MAX_JSON_BODY_BYTES);
  });

  it("reads a JSON body under the limit and refuses broken JSON with 400", async () => {
    expect(await readJsonBody(req("POST", { "content-type": "application/json" }, '{"a":1}'))).toEqual({ a: 1 });
    expect(await asyncCodeOf(readJsonBody(req("POST", { "content-type": "application/json" }, "{not json")))).toBe("bad_request:body 400");
  });
});

describe("cappedRequest (the upload service's route)", () => {
  it("passes a small body through whole and refuses one past the limit, declared or not (413)", async () => {
    const { cappedRequest } = await import("@/lib/auth/request-guard");
    const small = await cappedRequest(new Request("http://localhost/api/uploadthing", { method: "POST", body: JSON.stringify({ a: 1 }) }), 64);
    expect(await small.json()).toEqual({ a: 1 });
    await expect(cappedRequest(new Request("http://localhost/x", { method: "POST", body: "x".repeat(65), headers: { "content-length": "65" } }), 64)).rejects.toMatchObject({ status: 413 });
    const stream = new ReadableStream({ start: (c) => (c.enqueue(new TextEncoder().encode("y".repeat(100))), c.close()) });
    await expect(cappedRequest(new Request("http://localhost/x", { method: "POST", body: stream, duplex: "half" } as RequestInit), 64)).rejects.toMatchObject({ status: 413 });
  });
});
