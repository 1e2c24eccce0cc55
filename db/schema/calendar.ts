import { sqliteTable, text, integer, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id, createdAt, firmColumns } from "../columns";

/** The firm's filing calendar: its deadline rule and reminder schedule. One row per firm. */
export const calendarSettings = sqliteTable(
  "calendar_settings",
  {
    id: id(),
    ...firmColumns,
    /** "business-days-after" (deadlineValue = N) or "fixed-day-next-month" (deadlineValue = day of month) */
    deadlineRule: text("deadline_rule").notNull().default("business-days-after"),
    deadlineValue: integer("deadline_value").notNull().default(15),
    /** business days before the deadline at which reminders go out, JSON array */
    reminderOffsets: text("reminder_offsets", { mode: "json" }).$type<number[]>().notNull().default([10, 5, 2, 1]),
    remindOverdue: integer("remind_overdue", { mode: "boolean" }).notNull().default(true),
    autoOpenPeriods: integer("auto_open_periods", { mode: "boolean" }).notNull().default(true),
    updatedAt: text("updated_at"),
  },
  (t) => [uniqueIndex("calendar_settings_firm").on(t.firmId)],
);

/** Days that are not business days for the firm, beyond weekends. */
export const holidays = sqliteTable(
  "holidays",
  {
    id: id(),
    ...firmColumns,
    date: text("date").notNull(),
    name: text("name").notNull().default(""),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("holidays_firm_date").on(t.firmId, t.date)],
);

/** One row per reminder considered: period × step × offset × person. Written before the e-mail goes out. */
export const reminderLog = sqliteTable(
  "reminder_log",
  {
    id: id(),
    ...firmColumns,
    periodId: text("period_id").notNull(),
    step: text("step").notNull(),
    /** business days before the deadline; -1 for the overdue reminder */
    offsetDays: integer("offset_days").notNull(),
    userId: text("user_id").notNull(),
    email: text("email").notNull(),
    status: text("status").notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    lastError: text("last_error"),
    nextAttemptAt: text("next_attempt_at"),
    sentAt: text("sent_at"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("reminder_log_once").on(t.periodId, t.step, t.offsetDays, t.userId)],
);
