import { describe, expect, it, vi } from "vitest";

// These routes are public, so the gate is never asked; its module (Auth.js) does not load outside Next's server.
vi.mock("@/lib/auth/actor", () => ({ requireActor: () => Promise.reject(new Error("not used by public routes")) }));
import { route, etagOf, matchesEtag, JSON_CACHE_CONTROL } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";

const noParams = { params: Promise.resolve({}) };
const get = (headers: Record<string, string> = {}) => new Request("http://localhost/api/x", { headers });

describe("route(): caching headers of JSON answers", () => {
  const listing = route({ permission: "public" }, async () => ({ runs: [{ id: "r1", status: "running", progress: 40 }] }));

  it("says private, no-store and carries an ETag on a GET answered with a value", async () => {
    const response = await listing(get(), noParams);
    expect(response.status).toBe(200);
    expect(response.headers.get("cache-control")).toBe(JSON_CACHE_CONTROL);
    expect(response.headers.get("etag")).toBe(etagOf(JSON.stringify({ runs: [{ id: "r1", status: "running", progress: 40 }] })));
    expect(await response.json()).toEqual({ runs: [{ id: "r1", status: "running", progress: 40 }] });
  });

  it("answers 304 without a body when If-None-Match names the current ETag, and 200 when it names an old one", async () => {
    const etag = (await listing(get(), noParams)).headers.get("etag")!;
    const same = await listing(get({ "if-none-match": etag }), noParams);
    expect(same.status).toBe(304);
    expect(await same.text()).toBe("");
    expect(same.headers.get("etag")).toBe(etag);
    expect(same.headers.get("cache-control")).toBe(JSON_CACHE_CONTROL);
    const changed = await listing(get({ "if-none-match": '"an-older-answer"' }), noParams);
    expect(changed.status).toBe(200);
  });

  it("keeps a handler's own Cache-Control and adds the default to its JSON Response and to errors", async () => {
    const own = route({ permission: "public" }, async () => Response.json({ a: 1 }, { headers: { "cache-control": "no-cache" } }));
    expect((await own(get(), noParams)).headers.get("cache-control")).toBe("no-cache");
    const plain = route({ permission: "public" }, async () => Response.json({ a: 1 }));
    expect((await plain(get(), noParams)).headers.get("cache-control")).toBe(JSON_CACHE_CONTROL);
    const failing = route({ permission: "public" }, async () => {
      throw new AppError("not_found:run");
    });
    const error = await failing(get(), noParams);
    expect(error.status).toBe(404);
    expect(error.headers.get("cache-control")).toBe(JSON_CACHE_CONTROL);
  });

  it("leaves a file download's headers alone", async () => {
    const file = route({ permission: "public" }, async () => new Response("bytes", { headers: { "content-type": "application/octet-stream" } }));
    expect((await file(get(), noParams)).headers.get("cache-control")).toBeNull();
  });

  it("reads If-None-Match lists, weak forms and *", () => {
    expect(matchesEtag('"a", "b"', '"b"')).toBe(true);
    expect(matchesEtag('W/"b"', '"b"')).toBe(true);
    expect(matchesEtag("*", '"b"')).toBe(true);
    expect(matchesEtag('"a"', '"b"')).toBe(false);
    expect(matchesEtag(null, '"b"')).toBe(false);
  });
});
