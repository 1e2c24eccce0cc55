/**
 * The caution every screen and export with a capital or risk figure carries (the screens through
 * app/_components/draft-caution.tsx, the packs through reports/). One text, kept here so that the engine side and
 * the packs need nothing from app/.
 */
export const DRAFT_CAUTION =
  "Draft computed under the stated method and the firm's configured rules, for review and sign-off by the firm's licensed compliance officer. Local rules and the regulator's current requirements govern.";
