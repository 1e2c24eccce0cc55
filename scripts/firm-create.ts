/**
 * `npm run firm:create -- --name "Firm name" --currency EUR --admin-email person@firm.example [--admin-name "Name"]`
 * for an operator: creates the firm (with its default calendar rule and capital rule profile, and method approval
 * by two people), migrates the database first if needed, and invites its first administrator — by e-mail over the
 * configured SMTP transport, or, when none is configured (or the mail fails), by printing the single-use link to
 * pass on. Exits non-zero with a message naming the argument on bad input.
 *
 * Runs with `node --conditions=react-server` so that the app's server-only modules load outside Next.js.
 */
import { parseArgs } from "node:util";

async function main(): Promise<number> {
  let values: Record<string, string | boolean | undefined>;
  try {
    ({ values } = parseArgs({
      options: { name: { type: "string" }, currency: { type: "string" }, "admin-email": { type: "string" }, "admin-name": { type: "string" }, help: { type: "boolean" } },
      strict: true,
    }));
  } catch (error) {
    console.error(`firm:create: ${error instanceof Error ? error.message : error}`);
    return 2;
  }
  if (values.help) {
    console.log('usage: npm run firm:create -- --name "Firm name" --currency EUR --admin-email person@firm.example [--admin-name "Full name"]');
    return 0;
  }
  const email = String(values["admin-email"] ?? "");
  const { firmCreateArgsSchema } = await import("../lib/validation/accounts");
  const parsed = firmCreateArgsSchema.safeParse({
    name: values.name ?? "",
    currency: values.currency ?? "",
    adminEmail: email,
    // without --admin-name the part of the address before @ stands in until they are renamed in Settings
    adminName: values["admin-name"] ?? (email.split("@")[0] || ""),
  });
  if (!parsed.success) {
    for (const issue of parsed.error.issues) console.error(`firm:create: ${issue.message}`);
    return 2;
  }
  const { migrateDatabase } = await import("../db/migrate");
  await migrateDatabase();
  const { createFirmFromCommandLine, mailFirstAdmin } = await import("../lib/data/accounts");
  const { getMailer } = await import("../lib/mail/transport");
  const created = await createFirmFromCommandLine(parsed.data);
  console.log(`Created ${created.firmName} (${parsed.data.currency}, slug ${created.slug}); administrator ${parsed.data.adminEmail}.`);
  const mail = await mailFirstAdmin(created, { email: parsed.data.adminEmail, name: parsed.data.adminName });
  getMailer()?.close();
  if (created.existingAccount) {
    console.log(`${parsed.data.adminEmail} already has a Ballast account: they sign in with their existing password${mail.status === "sent" ? " (told by e-mail)" : ""}.`);
    return 0;
  }
  if (mail.status === "sent") {
    console.log(`Invitation e-mailed to ${parsed.data.adminEmail}; the link works once, until ${created.expiresAt} .`);
    return 0;
  }
  console.log(mail.status === "failed" ? `The invitation e-mail was not sent: ${mail.message}` : "No mail transport is configured (SMTP_HOST); pass this link on yourself.");
  console.log(`Single-use link for ${parsed.data.adminEmail}, valid until ${created.expiresAt}:`);
  console.log(created.link);
  return 0;
}

main().then(
  (code) => process.exit(code),
  (error) => {
    console.error(`firm:create failed: ${error instanceof Error ? error.message : error}`);
    process.exit(1);
  },
);
