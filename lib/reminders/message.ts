/** A reminder e-mail from templates/email/reminder.{txt,html}: firm, period, deadline, days left, step and a link. No figures. */
import { format, parseISO } from "date-fns";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { readTemplate, renderTemplate } from "@/lib/templates/render";
import type { OutgoingMail } from "@/lib/mail/transport";
import { timingText } from "./plan";

export interface ReminderContent {
  firmId: string;
  firmName: string;
  recipientName: string;
  email: string;
  periodId: string;
  periodEnd: string;
  deadline: string;
  stepLabel: string;
  owner: Role;
  businessDaysLeft: number;
  overdue: boolean;
  /** the app's public address, e.g. https://ballast.example.org */
  appUrl: string;
  /** the reminder_log row, carried in a header so that a message can be traced to its record */
  logId: string;
}

/** The app's public address for links in e-mails: BALLAST_URL, or the local default. */
export function appUrl(): string {
  return (process.env.BALLAST_URL || `http://localhost:${process.env.PORT ?? 3000}`).replace(/\/+$/, "");
}

export function reminderMessage(content: ReminderContent): OutgoingMail {
  const timing = timingText(content.businessDaysLeft, content.overdue);
  const values = {
    firmName: content.firmName,
    recipientName: content.recipientName,
    periodLabel: format(parseISO(content.periodEnd), "MMMM yyyy"),
    periodEnd: format(parseISO(content.periodEnd), "d MMMM yyyy"),
    deadline: format(parseISO(content.deadline), "EEEE d MMMM yyyy"),
    timing,
    timingTitle: timing.charAt(0).toUpperCase() + timing.slice(1),
    stepLabel: content.stepLabel,
    ownerLabel: ROLE_LABELS[content.owner],
    link: `${content.appUrl}/periods/${content.periodId}`,
    lead: content.overdue
      ? `The filing deadline for ${content.firmName} has passed and a step you own is still open.`
      : `${content.firmName} has a filing deadline coming up, and the next step is yours.`,
    footer: content.overdue
      ? "Overdue notices go to everyone who owns the step, including people who have turned reminders off."
      : `You receive this because you own this step. You can turn reminders off for yourself on the Calendar page: ${content.appUrl}/calendar`,
  };
  return {
    to: `${content.recipientName} <${content.email}>`,
    subject: renderTemplate(readTemplate("email/reminder-subject.txt"), values).trim(),
    text: renderTemplate(readTemplate("email/reminder.txt"), values),
    html: renderTemplate(readTemplate("email/reminder.html"), values, { html: true }),
    headers: { "X-Ballast-Firm": content.firmId, "X-Ballast-Reminder": content.logId },
  };
}
