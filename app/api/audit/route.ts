import { route } from "@/lib/auth/route";
import { listAuditEvents } from "@/lib/data/audit";
import { auditQuerySchema } from "@/lib/validation/audit";

/** The firm's audit trail, filtered and paged (administrators and auditors). */
export const GET = route({ permission: "audit.read", query: auditQuerySchema }, ({ actor, query }) => listAuditEvents(actor, query));
