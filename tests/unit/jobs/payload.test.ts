/** A job's payload is read back through its kind's schema: a payload that does not fit fails the job, naming the field. */
import { describe, expect, it } from "vitest";
import { filingPayloadSchema, readPayload, runPayloadSchema } from "@/lib/jobs/payload";

describe("readPayload", () => {
  it("returns the parsed payload", () => {
    expect(readPayload({ id: "j1", kind: "run", payload: { runId: "r1", excludeShortHistory: true } }, runPayloadSchema)).toEqual({ runId: "r1", excludeShortHistory: true });
  });

  it("names the job, its kind and the field that does not fit", () => {
    expect(() => readPayload({ id: "j2", kind: "run", payload: { runId: 7 } }, runPayloadSchema)).toThrow(/^Job j2 \(run\): its payload is not valid: runId: /);
    expect(() => readPayload({ id: "j3", kind: "pack-render", payload: null }, filingPayloadSchema)).toThrow(/^Job j3 \(pack-render\): its payload is not valid: payload: /);
  });
});
