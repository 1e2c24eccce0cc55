/** The demo firms' people and their demo-only password (db/seed.ts creates them; tests sign in as them). */

/** The demo-only password of every demo user. Never use it anywhere else. */
export const DEMO_PASSWORD = "ballast-demo-2026";

export const DEMO_USERS = [
  { email: "ada.quayle@northmoor.example", name: "Ada Quayle", roles: ["admin"] },
  { email: "tomas.reyne@northmoor.example", name: "Tomas Reyne", roles: ["compliance_officer"] },
  { email: "priya.castell@northmoor.example", name: "Priya Castell", roles: ["risk_analyst"] },
  { email: "helen.marsh@northmoor.example", name: "Helen Marsh", roles: ["compliance_head"] },
  { email: "oskar.lind@northmoor.example", name: "Oskar Lind", roles: ["auditor"] },
  { email: "nia.dorrance@northmoor.example", name: "Nia Dorrance", roles: ["compliance_officer", "risk_analyst"] },
] as const;

export const SECOND_FIRM_USERS = [
  { email: "rafe.pellam@pellam.example", name: "Rafe Pellam", roles: ["admin", "compliance_head"] },
  { email: "june.okafor@pellam.example", name: "June Okafor", roles: ["compliance_officer", "risk_analyst"] },
] as const;
