import { route } from "@/lib/auth/route";
import { downloadPack } from "@/lib/data/filings";
import { idParam } from "@/lib/validation/firm";
import { packResponse } from "../pack-response";

/** The Word filing pack of this version (any member); every download is recorded in the audit trail. */
export const GET = route({ permission: "member", params: idParam("filingId") }, async ({ actor, params }) => packResponse(await downloadPack(actor, params.filingId, "docx")));
