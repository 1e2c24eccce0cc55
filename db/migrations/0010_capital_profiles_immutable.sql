-- Capital rule profile versions are permanent: a change is a new version pointing at the one it replaces. The only
-- change a stored version allows is leaving force (active 1 → 0); none can be deleted. One version in force per firm.
CREATE TRIGGER capital_rule_profiles_no_update BEFORE UPDATE ON capital_rule_profiles
WHEN NOT (OLD.active = 1 AND NEW.active = 0)
  OR NEW.id IS NOT OLD.id OR NEW.firm_id IS NOT OLD.firm_id OR NEW.name IS NOT OLD.name
  OR NEW.confidence IS NOT OLD.confidence OR NEW.horizon_days IS NOT OLD.horizon_days
  OR NEW.averaging_days IS NOT OLD.averaging_days OR NEW.base_multiplier IS NOT OLD.base_multiplier
  OR NEW.stressed_multiplier IS NOT OLD.stressed_multiplier OR NEW.backtest_days IS NOT OLD.backtest_days
  OR NEW.plus_factors IS NOT OLD.plus_factors OR NEW.version IS NOT OLD.version OR NEW.regimes IS NOT OLD.regimes
  OR NEW.filed_regime IS NOT OLD.filed_regime OR NEW.standardised IS NOT OLD.standardised
  OR NEW.show_rwa IS NOT OLD.show_rwa OR NEW.reason IS NOT OLD.reason OR NEW.previous_id IS NOT OLD.previous_id
  OR NEW.created_by IS NOT OLD.created_by OR NEW.created_at IS NOT OLD.created_at
BEGIN
  SELECT RAISE(ABORT, 'a capital rule profile version cannot be changed; save a new version');
END;
--> statement-breakpoint
CREATE TRIGGER capital_rule_profiles_no_delete BEFORE DELETE ON capital_rule_profiles
BEGIN
  SELECT RAISE(ABORT, 'a capital rule profile version cannot be deleted');
END;
--> statement-breakpoint
CREATE UNIQUE INDEX capital_rule_profiles_one_active ON capital_rule_profiles (firm_id) WHERE active = 1;
