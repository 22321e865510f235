#!/usr/bin/env bash
# The same with curl: push a scan given as JSON points, then read gamma*.
# Needs KAPPALINE_URL, KAPPALINE_TOKEN, WS (workspace id) and STUDY (study id) in the environment.
set -euo pipefail
api="$KAPPALINE_URL/api/v1/workspaces/$WS/studies/$STUDY"

curl -sS --fail-with-body -X POST "$api/points" \
  -H "Authorization: Bearer $KAPPALINE_TOKEN" \
  -H 'Content-Type: application/json' \
  -H "Idempotency-Key: job-${SLURM_JOB_ID:-manual}-scan" \
  -d @- <<'JSON'
{"points": [
  {"gammaBohrInv": 0.20, "eNeutralHartree": -547.9120, "eCationHartree": -547.4470, "eAnionHartree": -547.9530,
   "homoNeutralHartree": -0.4420, "lumoNeutralHartree": -0.0610, "homoAnionHartree": -0.0190}
]}
JSON
echo
curl -sS --fail-with-body "$api/result" -H "Authorization: Bearer $KAPPALINE_TOKEN"
echo
