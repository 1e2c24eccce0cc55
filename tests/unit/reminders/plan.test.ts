import { describe, expect, it } from "vitest";
import { STEPS } from "@/lib/data/periods";
import { dueOffset, planReminders, timingText, OVERDUE_OFFSET, type PlanPerson } from "@/lib/reminders/plan";

const none = new Set<string>();
const schedule = { reminderOffsets: [10, 5, 2, 1], remindOverdue: true };
const people: PlanPerson[] = [
  { userId: "ada", name: "Ada", email: "ada@x.example", roles: ["admin"], remindersEnabled: true },
  { userId: "tomas", name: "Tomas", email: "tomas@x.example", roles: ["compliance_officer"], remindersEnabled: true },
  { userId: "priya", name: "Priya", email: "priya@x.example", roles: ["risk_analyst"], remindersEnabled: true },
  { userId: "helen", name: "Helen", email: "helen@x.example", roles: ["compliance_head"], remindersEnabled: true },
  { userId: "oskar", name: "Oskar", email: "oskar@x.example", roles: ["auditor"], remindersEnabled: true },
  { userId: "nia", name: "Nia", email: "nia@x.example", roles: ["compliance_officer", "risk_analyst"], remindersEnabled: false },
];
const period = (step: (typeof STEPS)[number] | null) => ({ id: "p1", periodEnd: "2026-11-30", deadline: "2026-12-21", nextStep: step });
const plan = (step: (typeof STEPS)[number] | null, asOf = "2026-12-14") => planReminders({ period: period(step), asOf, holidays: none, schedule, people });
const step = (key: string) => STEPS.find((s) => s.key === key)!;

describe("who gets which reminder", () => {
  it("follows the owner of the next step in each period state", () => {
    // Positions not confirmed → compliance officers (Nia has turned reminders off).
    expect(plan(step("positions")).map((r) => r.userId)).toEqual(["tomas"]);
    // No approved method, or no completed run → risk analysts.
    expect(plan(step("method")).map((r) => r.userId)).toEqual(["priya"]);
    expect(plan(step("run")).map((r) => r.userId)).toEqual(["priya"]);
    // The draft filing is not prepared → compliance officers; not signed → compliance heads.
    expect(plan(step("filing")).map((r) => r.userId)).toEqual(["tomas"]);
    expect(plan(step("signoff")).map((r) => r.userId)).toEqual(["helen"]);
    // Signed but not filed → compliance officers.
    expect(plan(step("file")).map((r) => r.userId)).toEqual(["tomas"]);
    // Filed: nobody.
    expect(plan(null)).toEqual([]);
  });

  it("carries the step, the offset and the days left", () => {
    expect(plan(step("signoff"))[0]).toEqual({
      periodId: "p1",
      step: "signoff",
      stepLabel: "Review and sign the filing",
      owner: "compliance_head",
      offsetDays: 5,
      userId: "helen",
      name: "Helen",
      email: "helen@x.example",
      businessDaysLeft: 5,
      overdue: false,
    });
  });

  it("sends the overdue notice to every owner, opted out or not", () => {
    const overdue = plan(step("positions"), "2026-12-22");
    expect(overdue.map((r) => [r.userId, r.offsetDays, r.overdue])).toEqual([
      ["tomas", OVERDUE_OFFSET, true],
      ["nia", OVERDUE_OFFSET, true],
    ]);
    expect(planReminders({ period: period(step("positions")), asOf: "2026-12-22", holidays: none, schedule: { ...schedule, remindOverdue: false }, people })).toEqual([]);
  });
});

describe("which reminder is due on a day", () => {
  // Deadline Monday 21 Dec 2026: 10 business days before is Monday 7 Dec, 5 is 14 Dec, 2 is 17 Dec, 1 is 18 Dec.
  const due = (asOf: string) => dueOffset(asOf, "2026-12-21", none, schedule);

  it("is the scheduled offset on its day, and nothing before the first", () => {
    expect(due("2026-12-01")).toBeNull(); // 14 business days left
    expect(due("2026-12-04")).toBeNull(); // 11 left
    expect(due("2026-12-07")).toBe(10);
    expect(due("2026-12-14")).toBe(5);
    expect(due("2026-12-17")).toBe(2);
    expect(due("2026-12-18")).toBe(1);
  });

  it("catches up a missed day with the latest reminder it missed (sent once: the log is unique)", () => {
    expect(due("2026-12-08")).toBe(10); // 9 left: the 10-day reminder if it has not gone yet
    expect(due("2026-12-12")).toBe(10); // a Saturday counts as the Friday before: 6 left
    expect(due("2026-12-15")).toBe(5); // 4 left: the 5-day reminder if the 14th was missed
  });

  it("on the deadline day sends the last reminder if missed, and after it the overdue notice", () => {
    expect(due("2026-12-21")).toBe(1);
    expect(due("2026-12-22")).toBe(OVERDUE_OFFSET);
    expect(due("2027-01-15")).toBe(OVERDUE_OFFSET);
  });

  it("words the timing plainly", () => {
    expect(timingText(5, false)).toBe("5 business days left");
    expect(timingText(1, false)).toBe("1 business day left");
    expect(timingText(0, false)).toBe("due today");
    expect(timingText(-1, true)).toBe("overdue by 1 business day");
    expect(timingText(-3, true)).toBe("overdue by 3 business days");
  });
});
