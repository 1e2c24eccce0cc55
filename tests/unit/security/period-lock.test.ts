import { beforeAll, describe, expect, it } from "vitest";
import { actorFor, freshDatabase, snapshot } from "../helpers/db";
import { receiveUploadBytes, confirmUpload, type UploadContext } from "@/lib/data/uploads";
import { listPeriods } from "@/lib/data/periods";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";

const HEADER = "as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure";
const enc = (text: string) => new TextEncoder().encode(text);
let db: Database;
let officer: Actor;
let periodId: string;
let n = 0;

const context = (): UploadContext => ({ firmId: officer.firmId, userId: officer.userId, userName: officer.name, periodId, kind: "positions", numberFormat: "plain" });
const file = () => ({ key: `lock${++n}`, name: `lock-${n}.csv`, ufsUrl: `http://127.0.0.1:9/f/lock${n}` });
const setPeriodState = (state: string) => db.$client.execute({ sql: "UPDATE reporting_periods SET state = ? WHERE id = ?", args: [state, periodId] });

beforeAll(async () => {
  process.env.BALLAST_CLOCK = "2026-12-01";
  process.env.UPLOADTHING_TOKEN ??= "";
  db = await freshDatabase();
  officer = await actorFor("tomas.reyne@northmoor.example");
  periodId = (await listPeriods(officer)).find((p) => p.periodEnd === "2026-11-30")!.id;
});

describe("nothing enters a period under review, signed or filed", () => {
  it.each(["in_review", "signed", "filed"])("a pending upload confirmed after the period became %s is refused, and nothing changes", async (state) => {
    await setPeriodState("open");
    const { uploadId } = await receiveUploadBytes(context(), file(), enc(`${HEADER}\n2026-11-30,T,EQ-${state},Alpha,equity,EUR,10,5,50,\n`));
    await setPeriodState(state);
    const before = await snapshot(db);
    await expect(confirmUpload(officer, uploadId, { acknowledgeWarnings: true })).rejects.toMatchObject({
      kind: "conflict",
      message: expect.stringContaining("new version of the filing"),
    });
    expect(await snapshot(db)).toEqual(before);
  });

  it.each(["in_review", "signed", "filed"])("a new upload into a %s period is refused before anything is stored", async (state) => {
    await setPeriodState(state);
    const before = await snapshot(db);
    await expect(receiveUploadBytes(context(), file(), enc(`${HEADER}\n2026-11-30,T,EQ-N${state},New,equity,EUR,1,5,5,\n`))).rejects.toMatchObject({ kind: "conflict" });
    expect(await snapshot(db)).toEqual(before);
  });

  it("an open period still takes a file", async () => {
    await setPeriodState("open");
    const { uploadId } = await receiveUploadBytes(context(), file(), enc(`${HEADER}\n2026-11-30,T,EQ-OPEN,Open,equity,EUR,1,5,5,\n`));
    await expect(confirmUpload(officer, uploadId, { acknowledgeWarnings: true })).resolves.toMatchObject({ status: "confirmed" });
  });
});
