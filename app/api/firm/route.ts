import { route } from "@/lib/auth/route";
import { getFirmSettings, updateFirmSettings } from "@/lib/data/firm";
import { firmSettingsSchema } from "@/lib/validation/firm";

/** The firm's settings (any member may read them). */
export const GET = route({ permission: "member" }, ({ actor }) => getFirmSettings(actor));

/** Change the firm's settings (administrators). */
export const PATCH = route({ permission: "firm.settings", body: firmSettingsSchema }, ({ actor, body }) => updateFirmSettings(actor, body));
