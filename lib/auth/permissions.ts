/**
 * The permission table: each named action and the roles that may take it. Reading is open to every member
 * of the firm ("member"); everything else names its roles. Tests walk this table for every route.
 */
import type { Role } from "./roles";

export const grants = {
  "firm.read": ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"],
  "firm.settings": ["admin"],
  "users.manage": ["admin"],
  "audit.read": ["admin", "auditor"],
  "periods.read": ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"],
  "periods.open": ["compliance_officer", "admin"],
  "positions.upload": ["compliance_officer"],
  "prices.upload": ["risk_analyst"],
  /** confirm a data-quality item that asks for it ("Extreme return to confirm") */
  "quality.confirm": ["risk_analyst", "compliance_officer"],
  "method.edit": ["risk_analyst"],
  "method.approve": ["risk_analyst", "compliance_head"],
  "capital.edit": ["compliance_officer", "compliance_head"],
  "run.start": ["risk_analyst"],
  "filing.prepare": ["compliance_officer"],
  "filing.review": ["compliance_head"],
  "filing.sign": ["compliance_head"],
  "filing.file": ["compliance_officer"],
  "calendar.manage": ["admin"],
  "mail.read": ["admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof grants;

/** Whether someone holding `roles` may take the action `permission`. */
export function can(actor: { roles: readonly Role[] }, permission: Permission): boolean {
  const allowed: readonly Role[] = grants[permission];
  return actor.roles.some((role) => allowed.includes(role));
}
