#!/usr/bin/env bash
# Build and browser-test in a slot of its own, so that two engineers working in one tree do not share the build
# folder, the ports or the e2e database. Usage: bash scripts/e2e-slot.sh SLOT [playwright args…]
# (SLOT 1–9; `npm run test:e2e` stays the plain, slot-less run that CI uses.)
# The ports avoid the ones fetch refuses ("bad port", e.g. 4190, 5060, 6000).
set -eu
slot=${1:?usage: e2e-slot.sh SLOT [playwright args]}
shift
export NEXT_DIST_DIR=".next-slot$slot"
export E2E_PORT=$((3100 + slot * 20)) E2E_UPLOAD_PORT=$((5110 + slot * 20))
export E2E_MAIL_SMTP_PORT=$((4125 + slot * 20)) E2E_MAIL_HTTP_PORT=$((4126 + slot * 20))
export E2E_DB_FILE="data/e2e-slot$slot.db" E2E_UPLOAD_DIR="data/e2e-uploads-slot$slot"
export E2E_OUTPUT_DIR="test-results/slot$slot" NEXT_TELEMETRY_DISABLED=1 PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1
mkdir -p data
if [ "${E2E_SKIP_BUILD:-0}" != "1" ]; then node node_modules/next/dist/bin/next build; fi
exec npx playwright test "$@"
