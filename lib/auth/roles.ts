/** The roles a membership can hold, and their plain names. Shared by server and client code. */
import { z } from "zod";

export const ROLES = ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"] as const;
export type Role = (typeof ROLES)[number];
export const roleSchema = z.enum(ROLES);

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Administrator",
  compliance_officer: "Compliance officer",
  risk_analyst: "Risk analyst",
  compliance_head: "Compliance head",
  auditor: "Auditor",
};

/** Keep only known role names from stored JSON, in the canonical order. */
export function parseRoles(value: unknown): Role[] {
  const list = Array.isArray(value) ? value : [];
  return ROLES.filter((role) => list.includes(role));
}
