/** The e-mails of invitations and password resets: plain text and simple HTML, with the single-use link. Pure. */
import type { OutgoingMail } from "@/lib/mail/transport";

const escape = (text: string) => text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
const when = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;

function html(paragraphs: string[], link: { href: string; label: string } | null): string {
  const body = paragraphs.map((p) => `<p>${escape(p)}</p>`).join("\n");
  const button = link ? `<p><a href="${escape(link.href)}">${escape(link.label)}</a></p>\n<p style="color:#555">${escape(link.href)}</p>` : "";
  return `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5">\n${body}\n${button}\n</body></html>`;
}

/** An invitation to join a firm: a new account sets its password through the link; an existing one just signs in. */
export function invitationMessage(input: {
  to: string;
  name: string;
  firmName: string;
  firmId: string;
  inviterName: string;
  roles: string[];
  /** the single-use link, or null when the person already has a Ballast account (they sign in as before) */
  link: string | null;
  signInUrl: string;
  expiresAt: string | null;
}): OutgoingMail {
  const lead = `${input.inviterName} has added you to ${input.firmName} in Ballast as ${input.roles.join(", ")}.`;
  const paragraphs = input.link
    ? [
        `Hello ${input.name},`,
        lead,
        `Choose your password through the link below. It works once and until ${when(input.expiresAt!)}; after that, ask your administrator for a new invitation.`,
        "If you did not expect this message, ignore it: nothing happens until the link is used.",
      ]
    : [`Hello ${input.name},`, lead, `Sign in with the password you already use for Ballast: ${input.signInUrl}`];
  const text = [...paragraphs.slice(0, 3), ...(input.link ? [input.link, paragraphs[3]] : [])].join("\n\n");
  return {
    to: input.to,
    subject: `You are invited to ${input.firmName} in Ballast`,
    text,
    html: html(paragraphs, input.link ? { href: input.link, label: "Choose your password" } : null),
    headers: { "X-Ballast-Firm": input.firmId },
  };
}

/** A password reset: the single-use link, and what to do when the person did not ask for it. */
export function resetMessage(input: { to: string; name: string; firmId: string | null; link: string; expiresAt: string }): OutgoingMail {
  const paragraphs = [
    `Hello ${input.name},`,
    `Someone asked to reset the password of your Ballast account. Choose a new password through the link below; it works once and until ${when(input.expiresAt)}.`,
    "If it was not you, ignore this message: your password stays as it is.",
  ];
  return {
    to: input.to,
    subject: "Reset your Ballast password",
    text: [paragraphs[0], paragraphs[1], input.link, paragraphs[2]].join("\n\n"),
    html: html(paragraphs, { href: input.link, label: "Choose a new password" }),
    headers: input.firmId ? { "X-Ballast-Firm": input.firmId } : undefined,
  };
}
