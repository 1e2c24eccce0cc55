import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { getFirmSettings } from "@/lib/data/firm";
import { listMembers } from "@/lib/data/members";
import { FirmSettingsForm } from "./firm-settings-form";
import { MembersPanel } from "./members-panel";
import { CalendarSettingsSection } from "./calendar-settings-section";
import { capitalProfileScreen } from "@/lib/data/capital-profile";
import { CapitalProfileForm } from "./capital-profile-form";

export const metadata: Metadata = { title: "Settings" };

export default async function SettingsPage() {
  const { actor } = await pageActor("firm.read");
  const settings = await getFirmSettings(actor);
  const admin = can(actor, "users.manage");
  const members = admin ? await listMembers(actor) : [];
  const capital = await capitalProfileScreen(actor);
  return (
    <>
      <PageHeader
        title="Settings"
        lead={
          admin
            ? "The firm's profile, its filing deadline rule, who may do what, and the capital rule profile."
            : `The firm's profile (only an administrator can change it) and the capital rule profile${can(actor, "capital.edit") ? ", which you can change" : ""}.`
        }
      />
      <p className="-mt-2 mb-6 text-sm">
        <Link href="/settings/account" className="underline">
          Your account and password
        </Link>
      </p>
      <div className="grid gap-8 xl:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <section aria-labelledby="firm-heading">
          <h2 id="firm-heading" className="mb-3 text-lg font-semibold">
            Firm
          </h2>
          <FirmSettingsForm initial={settings} editable={can(actor, "firm.settings")} />
        </section>
        {admin ? (
          <section aria-labelledby="members-heading">
            <h2 id="members-heading" className="mb-3 text-lg font-semibold">
              People and roles
            </h2>
            <MembersPanel initial={members} currentUserId={actor.userId} />
          </section>
        ) : null}
      </div>
      <section aria-labelledby="capital-heading" className="mt-8">
        <h2 id="capital-heading" className="mb-3 text-lg font-semibold">
          Capital rule profile
        </h2>
        <CapitalProfileForm current={capital.current} versions={capital.versions} editable={can(actor, "capital.edit")} />
      </section>
      {can(actor, "calendar.manage") ? <CalendarSettingsSection actor={actor} /> : null}
    </>
  );
}
