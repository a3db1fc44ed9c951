#!/usr/bin/env bash
# A test of `bin/kilocycle cluster`: bad input refused with a message, a cluster of two nodes started in its own
# var/ on ports of its own, health and sign-in through haproxy, reads served by the replica, `cluster status`,
# `cluster stop` from another shell, a second start that keeps the replica (no new copy), and Ctrl-C (SIGINT)
# ending every part. Needs root's Debian packages (haproxy, redis-server, mariadb-backup) or installs them as root.
#   backend/test/cluster/cluster-command.sh            (ports 5380-5389, 3517, 3518, 6580 by default)
# Environment: KC_TEST_CLUSTER_DIR (default: a new folder under /tmp, removed at the end), KC_PORT, KC_DB_PORT,
# KC_DB_REPLICA_PORT, KC_REDIS_PORT.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../../.." && pwd)"
DIR="${KC_TEST_CLUSTER_DIR:-$(mktemp -d /tmp/kc-cluster-test-XXXXXX)}"
export KC_VAR_DIR="$DIR/var" KC_PORT="${KC_PORT:-5380}" KC_DB_PORT="${KC_DB_PORT:-3517}"
export KC_DB_REPLICA_PORT="${KC_DB_REPLICA_PORT:-3518}" KC_REDIS_PORT="${KC_REDIS_PORT:-6580}" KC_DB_BUFFER_POOL="${KC_DB_BUFFER_POOL:-256M}"
OUT="$DIR/cluster.out"
passed=0
failed=0
starter=""

ok() { passed=$((passed + 1)); printf 'ok      %s\n' "$1"; }
fail() { failed=$((failed + 1)); printf 'FAILED  %s\n' "$1"; [ -z "${2:-}" ] || printf '        %s\n' "$2"; }
check() { if eval "$2"; then ok "$1"; else fail "$1" "${3:-}"; fi; }

# The cluster in a session of its own with SIGINT at its default (a background job of a script ignores it), so a
# signal to its process group is what Ctrl-C in a terminal sends.
start_cluster() {
  setsid python3 -c 'import signal,os,sys; signal.signal(signal.SIGINT, signal.SIG_DFL); os.execvp(sys.argv[1], sys.argv[1:])' \
    "$ROOT/bin/kilocycle" cluster start "$@" >"$OUT" 2>&1 &
  starter=$!
  for _ in $(seq 1 400); do
    grep -q 'Kilocycle is running on' "$OUT" && return 0
    kill -0 "$starter" 2>/dev/null || break
    sleep 0.5
  done
  cat "$OUT"
  return 1
}

finish() {
  [ -n "$starter" ] && kill -0 "$starter" 2>/dev/null && "$ROOT/bin/kilocycle" cluster stop >/dev/null 2>&1 || true
  [ -n "${KC_TEST_CLUSTER_DIR:-}" ] || rm -rf "$DIR"
}
trap finish EXIT

# The tree is built already (as bin/kilocycle test builds it first): a fresh var/ would otherwise rebuild it all.
mkdir -p "$KC_VAR_DIR"
[ -f "$ROOT/backend/dist/main.js" ] && [ -f "$ROOT/frontend/dist/index.html" ] && touch "$KC_VAR_DIR/build.stamp"

nothing_left() {
  local port
  for port in "$KC_PORT" $((KC_PORT + 1)) $((KC_PORT + 2)) $((KC_PORT + 9)) "$KC_DB_PORT" "$KC_DB_REPLICA_PORT" "$KC_REDIS_PORT"; do
    (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null && { echo "port $port still answers"; return 1; }
  done
  ! pgrep -f "$KC_VAR_DIR" >/dev/null
}

# ---- refusals, before anything starts ----
msg="$("$ROOT/bin/kilocycle" cluster start --nodes 9 2>&1 || true)"
check 'refuses --nodes 9, naming the range' '[[ "$msg" == *"--nodes must be a whole number from 1 to 8 (got '"'"'9'"'"')"* ]]' "$msg"
msg="$(KC_REDIS_PORT=$KC_DB_PORT "$ROOT/bin/kilocycle" cluster start 2>&1 || true)"
check 'refuses two parts on one port, naming both' '[[ "$msg" == *"port $KC_DB_PORT is given twice"* ]]' "$msg"
python3 -c 'import socket,time,sys; s=socket.socket(); s.setsockopt(socket.SOL_SOCKET, socket.SO_REUSEADDR, 1); s.bind(("127.0.0.1", int(sys.argv[1]))); s.listen(); time.sleep(30)' "$KC_REDIS_PORT" &
squatter=$!
sleep 0.5
msg="$("$ROOT/bin/kilocycle" cluster start 2>&1 || true)"
kill "$squatter"
check 'refuses a port in use, naming it and what to do' '[[ "$msg" == *"port $KC_REDIS_PORT (Redis (KC_REDIS_PORT)) is already in use"* ]]' "$msg"
msg="$("$ROOT/bin/kilocycle" cluster status 2>&1)" && rc=0 || rc=$?
check 'status before any start says so (exit 3)' '[ "$rc" = 3 ] && [[ "$msg" == *"No cluster has been started"* ]]' "$msg"

# ---- a cluster of two ----
check 'cluster start --nodes 2 comes up' 'start_cluster --nodes 2'
check 'mariadb-backup copied the primary into the replica' 'grep -q "Copying the primary into the replica" "$OUT"'
code="$(curl -s -o /dev/null -w '%{http_code}' "http://127.0.0.1:$KC_PORT/api/health/ready")"
check 'GET /api/health/ready through haproxy answers 200' '[ "$code" = 200 ]' "got $code"
token="$(curl -s -H 'content-type: application/json' -d '{"email":"lead@kilocycle.test","password":"kilocycle-demo"}' \
  "http://127.0.0.1:$KC_PORT/api/auth/login" | node -pe 'JSON.parse(require("fs").readFileSync(0)).accessToken || ""' 2>/dev/null || true)"
check 'signing in through haproxy works' '[ -n "$token" ]'
codes=""
for port in $((KC_PORT + 1)) $((KC_PORT + 2)); do codes="$codes $(curl -s -o /dev/null -w '%{http_code}' -H "Authorization: Bearer $token" "http://127.0.0.1:$port/api/instruments")"; done
check 'the session is good on both nodes (one shared secret)' '[ "$codes" = " 200 200" ]' "got$codes"
replica_sock="$KC_VAR_DIR/cluster/replica/mysqld.sock"
selects() { mariadb --no-defaults --socket="$replica_sock" -uroot -N -e "SHOW GLOBAL STATUS LIKE 'Com_select'" | awk '{ print $2 }'; }
before="$(selects)"
for _ in 1 2 3 4; do curl -s -o /dev/null -H "Authorization: Bearer $token" "http://127.0.0.1:$KC_PORT/api/instruments"; done
after="$(selects)"
check 'lists are read on the replica (its Com_select rises)' '[ "$after" -gt $((before + 4)) ]' "$before -> $after"
status="$("$ROOT/bin/kilocycle" cluster status 2>&1)" && rc=0 || rc=$?
check 'cluster status: exit 0, every part named' '[ "$rc" = 0 ] && [[ "$status" == *"binlog on"* ]] && [[ "$status" == *"receiving (Slave_IO_Running) Yes, applying (Slave_SQL_Running) Yes"* ]] && [[ "$status" == *"answers PING"* ]] && [[ "$status" == *"node-2 "*"ready (database up, redis up)"* ]] && [[ "$status" == *"node-1 UP, node-2 UP"* ]]' "$status"
secret_mode="$(stat -c %a "$KC_VAR_DIR/cluster/keys/jwt-secret") $(stat -c %a "$KC_VAR_DIR/cluster/keys/certificate-signing.key.pem")"
check 'the shared secret and key are mode 0600' '[ "$secret_mode" = "600 600" ]' "$secret_mode"

# ---- cluster stop from another shell ----
"$ROOT/bin/kilocycle" cluster stop >/dev/null 2>&1
check 'cluster stop ends the starter and every part' '! kill -0 "$starter" 2>/dev/null && nothing_left'

# ---- a second start keeps the replica, then Ctrl-C ----
check 'a second start comes up' 'start_cluster --nodes 1'
check 'without a new copy of the primary' '! grep -q "Copying the primary" "$OUT"'
status="$("$ROOT/bin/kilocycle" cluster status 2>&1)" && rc=0 || rc=$?
check 'and the replica replicates again' '[ "$rc" = 0 ] && [[ "$status" == *"applying (Slave_SQL_Running) Yes"* ]]' "$status"
kill -INT -- "-$starter"
for _ in $(seq 1 120); do kill -0 "$starter" 2>/dev/null || break; sleep 0.5; done
check 'Ctrl-C (SIGINT) stops every part' '! kill -0 "$starter" 2>/dev/null && nothing_left && grep -q "Stopped. Data is kept" "$OUT"'

printf '\n%d passed, %d failed\n' "$passed" "$failed"
[ "$failed" -eq 0 ]
