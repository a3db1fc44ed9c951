# shellcheck shell=bash
# bin/kilocycle cluster: several app nodes on this machine, on loopback only, behind Debian's haproxy, sharing
# Debian's redis-server and the private MariaDB (the primary, with a binlog) plus one MariaDB replica for reads.
# Sourced by bin/kilocycle, whose helpers (say, die, port_in_use, apt_ensure, db_start, db_stop, db_sql,
# bootstrap, node_cli) it uses.

CL_DIR="$VAR/cluster"
CL_LOGS="$CL_DIR/logs"
CL_RUN="$CL_DIR/run"
CL_KEYS="$CL_DIR/keys"
CL_STATE="$CL_RUN/state"
REPLICA_DIR="$CL_DIR/replica"
REPLICA_DATA="$REPLICA_DIR/data"
REPLICA_SOCK="$REPLICA_DIR/mysqld.sock"
REPLICA_PID="$REPLICA_DIR/mysqld.pid"
REDIS_DIR="$VAR/redis"
HAPROXY_CFG="$CL_DIR/haproxy.cfg"
REPL_USER=kc_repl
# The primary's binlog, in cluster mode only (bin/kilocycle start and db start run without one): GTIDs come with
# it in MariaDB; ROW format; triggers made by the app user (migrations) need log_bin_trust_function_creators
# once a binlog is on; binlogs older than a week are removed.
PRIMARY_CLUSTER_ARGS=(--server-id=1 --log-bin=primary-bin --binlog-format=ROW --log-bin-trust-function-creators=1
  --binlog-expire-logs-seconds=604800)
READY_TIMEOUT=60

cluster_usage() {
  cat <<EOF
Usage: bin/kilocycle cluster start [--nodes N] [--reseed]
       bin/kilocycle cluster status
       bin/kilocycle cluster stop

Runs Kilocycle as several app nodes on this machine, every part on 127.0.0.1 only:
  haproxy           on \$KC_PORT (default 5180): the address to open; health checks on /api/health/ready;
                    its stats page on \$KC_PORT+9
  N app nodes       node-1 … node-N on \$KC_PORT+1 … \$KC_PORT+N (N from 1 to 8, default 2)
  MariaDB primary   the private database on \$KC_DB_PORT (default 3317), here with a binlog (GTID)
  MariaDB replica   on \$KC_DB_REPLICA_PORT (default 3318), data in var/cluster/replica, read-only, replicating
                    from the primary with GTID; copied from the primary with mariadb-backup the first time
  Redis             on \$KC_REDIS_PORT (default 6380), config and data in var/redis
The session secret and the certificate signing key every node reads are made once, in var/cluster/keys
(the lab's own var/jwt-secret and var/keys key are copied there when they exist). Logs: var/cluster/logs.

  start     starts every part (installing haproxy, redis-server and mariadb-backup when run as root), runs
            migrations and the demo data once, and waits until each node is ready; Ctrl-C stops everything
            --nodes N   how many app nodes (1 to 8, default 2)
            --reseed    copy the primary into the replica afresh (after a replication error, or when the
                        database was used by bin/kilocycle start in between: that path has no binlog)
  status    each part in plain words (exit 3 when a part is not running)
  stop      stops a cluster started from another shell
EOF
}

cluster_cmd() {
  case "${1:-}" in
    start) shift; cluster_start "$@" ;;
    status) cluster_status ;;
    stop) cluster_stop ;;
    -h | --help | "") cluster_usage ;;
    *) die "unknown cluster command '$1' (see bin/kilocycle cluster --help)" ;;
  esac
}

cl_pid_alive() { [ -n "${1:-}" ] && kill -0 "$1" 2>/dev/null; }
cl_pid() { cat "$CL_RUN/$1.pid" 2>/dev/null || true; }
replica_sql() { mariadb --no-defaults --socket="$REPLICA_SOCK" -uroot "$@"; }
replica_running() { [ -S "$REPLICA_SOCK" ] && mariadb-admin --no-defaults --socket="$REPLICA_SOCK" -uroot ping >/dev/null 2>&1; }
http_code() { curl -s -o /dev/null -m "${2:-3}" -w '%{http_code}' "$1" 2>/dev/null || true; }

# Ports: KC_PORT (haproxy), KC_PORT+1…+N (nodes), KC_PORT+9 (stats), the two databases and Redis, all different.
cl_check_ports() {
  local nodes="$1" var
  for var in KC_DB_REPLICA_PORT KC_REDIS_PORT; do
    [[ "${!var}" =~ ^[0-9]+$ ]] && [ "${!var}" -ge 1 ] && [ "${!var}" -le 65535 ] \
      || die "$var must be a port number from 1 to 65535 (got '${!var}')"
  done
  [ $((KC_PORT + 9)) -le 65535 ] || die "KC_PORT=$KC_PORT leaves no room for the nodes and the stats page (KC_PORT+1 … KC_PORT+9): use a lower port"
  local -A seen=()
  local name port
  local -a parts=("haproxy (KC_PORT)=$KC_PORT" "haproxy stats (KC_PORT+9)=$((KC_PORT + 9))" "the primary (KC_DB_PORT)=$KC_DB_PORT"
    "the replica (KC_DB_REPLICA_PORT)=$KC_DB_REPLICA_PORT" "Redis (KC_REDIS_PORT)=$KC_REDIS_PORT")
  for i in $(seq 1 "$nodes"); do parts+=("node-$i (KC_PORT+$i)=$((KC_PORT + i))"); done
  for part in "${parts[@]}"; do
    name="${part%=*}"
    port="${part##*=}"
    [ -z "${seen[$port]:-}" ] || die "port $port is given twice: to ${seen[$port]} and to $name; set them apart"
    seen[$port]="$name"
  done
  for part in "${parts[@]}"; do
    name="${part%=*}"
    port="${part##*=}"
    port_in_use "$port" && die "port $port ($name) is already in use by another program: stop it (a cluster left running? bin/kilocycle cluster stop), or choose another port (see bin/kilocycle cluster --help)"
  done
  return 0
}

# The files every node reads: made once, as an operator would. The lab's own secret and key are kept when present,
# so sessions and issued certificates stay valid.
cl_keys() {
  mkdir -p "$CL_KEYS" && chmod 700 "$CL_KEYS"
  local secret="$CL_KEYS/jwt-secret" key="$CL_KEYS/certificate-signing.key.pem"
  if [ ! -s "$secret" ]; then
    if [ -s "$VAR/jwt-secret" ] && [ "$(tr -d '\n' <"$VAR/jwt-secret" | wc -c)" -ge 32 ]; then
      (umask 077 && cp "$VAR/jwt-secret" "$secret")
      say "Session secret: copied var/jwt-secret to $secret (sessions already signed stay valid)"
    else
      (umask 077 && node -e 'console.log(require("crypto").randomBytes(32).toString("hex"))' >"$secret")
      say "Session secret: made $secret (64 hex characters)"
    fi
  fi
  if [ ! -s "$key" ]; then
    if [ -s "$VAR/keys/certificate-signing.key.pem" ]; then
      (umask 077 && cp "$VAR/keys/certificate-signing.key.pem" "$key")
      say "Certificate signing key: copied the lab's key from var/keys to $key"
    else
      (umask 077 && node -e 'process.stdout.write(require("crypto").generateKeyPairSync("ed25519").privateKey.export({type:"pkcs8",format:"pem"}))' >"$key")
      say "Certificate signing key: made $key (Ed25519)"
    fi
  fi
  chmod 600 "$secret" "$key"
}

cl_repl_password() {
  local f="$CL_DIR/replication-password"
  [ -s "$f" ] || (umask 077 && node -e 'console.log(require("crypto").randomBytes(18).toString("base64url"))' >"$f")
  cat "$f"
}

# The cluster starts its own primary (with a binlog), so a database already running is refused, never stopped.
cl_primary_free() {
  db_running || return 0
  [ "$(db_sql -N -e 'SELECT @@log_bin')" = 1 ] \
    || die "the private database is running without a binlog (started by bin/kilocycle start or db start): stop it (Ctrl-C in that shell, or bin/kilocycle db stop), then run cluster start again"
  die "the private database is already running with a binlog (a cluster left running?): bin/kilocycle cluster stop, then try again"
}

cl_primary_start() {
  DB_EXTRA_ARGS=("${PRIMARY_CLUSTER_ARGS[@]}")
  db_start
  DB_EXTRA_ARGS=()
  local pw
  pw="$(cl_repl_password)"
  # Kept out of the binlog: the replica never logs in as this user.
  db_sql <<SQL || die "could not create the replication user on the primary"
SET sql_log_bin = 0;
CREATE USER IF NOT EXISTS '$REPL_USER'@'127.0.0.1' IDENTIFIED BY '$pw';
ALTER USER '$REPL_USER'@'127.0.0.1' IDENTIFIED BY '$pw';
GRANT REPLICATION SLAVE ON *.* TO '$REPL_USER'@'127.0.0.1';
SET sql_log_bin = 1;
SQL
}

# A physical copy of the primary (mariadb-backup: consistent, and fast for a large readings table), with the GTID
# position it was taken at; the replica starts replicating from there.
cl_replica_seed() {
  local log="$CL_LOGS/replica-seed.log" backup="$REPLICA_DIR/backup"
  rm -rf "$REPLICA_DATA" "$backup"
  mkdir -p "$REPLICA_DIR"
  say "Copying the primary into the replica with mariadb-backup (log: $log) …"
  {
    mariadb-backup --no-defaults --backup --socket="$DB_SOCK" --user=root --datadir="$DB_DATA" --target-dir="$backup" &&
      mariadb-backup --no-defaults --prepare --target-dir="$backup" &&
      mariadb-backup --no-defaults --copy-back --target-dir="$backup" --datadir="$REPLICA_DATA"
  } >"$log" 2>&1 || { tail -5 "$log" >&2; die "mariadb-backup could not copy the primary into the replica (full log: $log)"; }
  local info gtid=""
  for info in "$backup/mariadb_backup_binlog_info" "$backup/xtrabackup_binlog_info"; do
    [ -f "$info" ] && gtid="$(awk '{ print $3 }' "$info")" && break
  done
  [ -n "$gtid" ] || die "mariadb-backup recorded no GTID position (is the primary's binlog on?); see $log"
  echo "$gtid" >"$REPLICA_DIR/seed-gtid"
  rm -rf "$backup"
}

cl_replica_start() {
  rm -f "$REPLICA_SOCK"
  setsid mariadbd --no-defaults --datadir="$REPLICA_DATA" --socket="$REPLICA_SOCK" --port="$KC_DB_REPLICA_PORT" \
    --bind-address=127.0.0.1 --pid-file="$REPLICA_PID" --log-error="$CL_LOGS/replica.log" --user="$(id -un)" \
    --server-id=2 --read-only=1 --relay-log=replica-relay-bin --skip-slave-start \
    --innodb-buffer-pool-size="${BUFFER_POOL_MB}M" --max-connections=300 --skip-name-resolve \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci </dev/null >/dev/null 2>&1 &
  for _ in $(seq 1 60); do replica_running && break; sleep 0.5; done
  replica_running || die "the replica did not start; last lines of $CL_LOGS/replica.log: $(tail -3 "$CL_LOGS/replica.log" 2>/dev/null | tr '\n' ' ')"
  local pw set_position=""
  pw="$(cl_repl_password)"
  [ -f "$REPLICA_DIR/seed-gtid" ] && set_position="SET GLOBAL gtid_slave_pos = '$(cat "$REPLICA_DIR/seed-gtid")';"
  replica_sql <<SQL || die "could not point the replica at the primary (see $CL_LOGS/replica.log)"
STOP SLAVE;
$set_position
CHANGE MASTER TO MASTER_HOST = '127.0.0.1', MASTER_PORT = $KC_DB_PORT, MASTER_USER = '$REPL_USER',
  MASTER_PASSWORD = '$pw', MASTER_USE_GTID = slave_pos, MASTER_CONNECT_RETRY = 2;
START SLAVE;
SQL
  rm -f "$REPLICA_DIR/seed-gtid"
  # Caught up with everything the primary had committed (at most 60 s), or say why not.
  local position waited
  position="$(db_sql -N -e 'SELECT @@gtid_binlog_pos')"
  waited="$(replica_sql -N -e "SELECT MASTER_GTID_WAIT('$position', $READY_TIMEOUT)")"
  if [ "$waited" != 0 ]; then
    cl_replica_words >&2
    die "the replica did not catch up with the primary in $READY_TIMEOUT s; if it reports an error, run bin/kilocycle cluster start --reseed"
  fi
}

# One line on the replica: running, replicating, how far behind.
cl_replica_words() {
  if ! replica_running; then say "  replica MariaDB   127.0.0.1:$KC_DB_REPLICA_PORT  NOT RUNNING (log: $CL_LOGS/replica.log)"; return 1; fi
  local status
  status="$(replica_sql -e 'SHOW SLAVE STATUS\G' 2>/dev/null || true)"
  field() { awk -F': ' -v k="$1" '$1 ~ "^ *"k"$" { print $2; exit }' <<<"$status"; }
  local io sql behind err
  io="$(field Slave_IO_Running)"; sql="$(field Slave_SQL_Running)"; behind="$(field Seconds_Behind_Master)"
  err="$(field Last_IO_Error)"; [ -n "$err" ] || err="$(field Last_SQL_Error)"
  if [ -z "$status" ]; then
    say "  replica MariaDB   127.0.0.1:$KC_DB_REPLICA_PORT  running but not replicating (no CHANGE MASTER): run cluster start --reseed"
    return 1
  fi
  local words="running, read-only; receiving (Slave_IO_Running) $io, applying (Slave_SQL_Running) $sql"
  if [ "$behind" = NULL ] || [ -z "$behind" ]; then words="$words, lag unknown (Seconds_Behind_Master NULL)"; else words="$words, $behind s behind the primary (Seconds_Behind_Master)"; fi
  [ -n "$err" ] && words="$words; last error: $err"
  say "  replica MariaDB   127.0.0.1:$KC_DB_REPLICA_PORT  $words"
  [ "$io" = Yes ] && [ "$sql" = Yes ]
}

cl_redis_start() {
  mkdir -p "$REDIS_DIR"
  cat >"$REDIS_DIR/redis.conf" <<EOF
# Written by bin/kilocycle cluster start at each start: edit KC_REDIS_PORT, not this file.
bind 127.0.0.1
port $KC_REDIS_PORT
protected-mode yes
daemonize no
dir $REDIS_DIR
pidfile $REDIS_DIR/redis.pid
logfile $CL_LOGS/redis.log
save 300 10
appendonly no
EOF
  setsid redis-server "$REDIS_DIR/redis.conf" </dev/null >/dev/null 2>&1 &
  echo $! >"$CL_RUN/redis.pid"
  for _ in $(seq 1 40); do
    [ "$(redis-cli -h 127.0.0.1 -p "$KC_REDIS_PORT" ping 2>/dev/null)" = PONG ] && return 0
    cl_pid_alive "$(cl_pid redis)" || break
    sleep 0.25
  done
  die "Redis did not start on 127.0.0.1:$KC_REDIS_PORT; last lines of $CL_LOGS/redis.log: $(tail -3 "$CL_LOGS/redis.log" 2>/dev/null | tr '\n' ' ')"
}

cl_node_start() {
  local i="$1" public="$2" port=$((KC_PORT + i)) log="$CL_LOGS/node-$i.log"
  (
    export KC_PORT="$port" KC_HOST=127.0.0.1 KC_NODE_NAME="node-$i" KC_PUBLIC_URL="$public"
    export KC_REDIS_URL="redis://127.0.0.1:$KC_REDIS_PORT"
    export KC_JWT_SECRET_FILE="$CL_KEYS/jwt-secret" KC_SIGNING_KEY_FILE="$CL_KEYS/certificate-signing.key.pem"
    export KC_DB_REPLICA_HOST=127.0.0.1 KC_DB_REPLICA_PORT="$KC_DB_REPLICA_PORT" KC_TRUSTED_PROXIES=127.0.0.1
    # Each node's own mail catcher on a port it picks (they would clash on one); messages land in the shared outbox.
    [ -n "${KC_SMTP_HOST:-}" ] || export KC_SMTP_PORT=0
    # Likewise each node's payment service fake (without a real key): its page and webhooks belong to that node.
    [ -n "${KC_STRIPE_SECRET_KEY:-}" ] || export KC_PAYMENT_FAKE_PORT=0
    cd "$ROOT" && exec setsid node backend/dist/main.js
  ) >>"$log" 2>&1 </dev/null &
  echo $! >"$CL_RUN/node-$i.pid"
}

cl_haproxy_config() {
  local nodes="$1" i
  {
    cat <<EOF
# Written by bin/kilocycle cluster start at each start (KC_PORT, --nodes): edit those, not this file.
global
    maxconn 4096
    log stdout format raw local0 info

defaults
    mode http
    log global
    option httplog
    option dontlognull
    # The client's address for the nodes (KC_TRUSTED_PROXIES=127.0.0.1 makes them believe it).
    option forwardfor
    # A request for a node that went down goes to another one.
    option redispatch
    retries 2
    timeout connect 5s
    timeout client 60s
    timeout http-request 30s
    # Long enough for a large CSV import or a certificate batch between two bytes of the answer.
    timeout server 5m
    # WebSockets (live readings, bench bridges) stay open for hours: an hour without a byte ends one.
    timeout tunnel 1h
    timeout client-fin 30s
    timeout queue 30s

frontend kilocycle
    bind 127.0.0.1:$KC_PORT
    default_backend nodes

backend nodes
    balance leastconn
    # Browsers' socket.io starts with long-polling before it upgrades to a WebSocket: every request of one
    # browser must reach the node holding its socket.io session, so the first answer sets a cookie naming it.
    cookie KC_NODE insert indirect nocache httponly attr "SameSite=Lax"
    option httpchk GET /api/health/ready
    http-check expect status 200
    default-server inter 2s fall 2 rise 2
EOF
    for i in $(seq 1 "$nodes"); do
      printf '    server node-%d 127.0.0.1:%d check cookie node-%d\n' "$i" $((KC_PORT + i)) "$i"
    done
    cat <<EOF

listen stats
    bind 127.0.0.1:$((KC_PORT + 9))
    stats enable
    stats uri /
    stats refresh 5s
EOF
  } >"$HAPROXY_CFG"
  haproxy -c -q -f "$HAPROXY_CFG" >"$CL_LOGS/haproxy-check.log" 2>&1 \
    || die "haproxy refuses the configuration it was given: $(head -5 "$CL_LOGS/haproxy-check.log" | tr '\n' ' ') ($HAPROXY_CFG)"
}

cl_haproxy_start() {
  setsid haproxy -db -f "$HAPROXY_CFG" >>"$CL_LOGS/haproxy.log" 2>&1 </dev/null &
  echo $! >"$CL_RUN/haproxy.pid"
  for _ in $(seq 1 40); do
    [ "$(http_code "http://127.0.0.1:$KC_PORT/api/health/ready")" = 200 ] && return 0
    cl_pid_alive "$(cl_pid haproxy)" || break
    sleep 0.5
  done
  die "haproxy did not answer on 127.0.0.1:$KC_PORT; last lines of $CL_LOGS/haproxy.log: $(tail -3 "$CL_LOGS/haproxy.log" 2>/dev/null | tr '\n' ' ')"
}

# Waits until every node answers 200 on /api/health/ready; a node that stops or is not ready in 60 s is named
# with the end of its log.
cl_nodes_ready() {
  local nodes="$1" i waited=0 pending
  while :; do
    pending=0
    for i in $(seq 1 "$nodes"); do
      [ -f "$CL_RUN/node-$i.ready" ] && continue
      if [ "$(http_code "http://127.0.0.1:$((KC_PORT + i))/api/health/ready" 2)" = 200 ]; then
        touch "$CL_RUN/node-$i.ready"
        say "node-$i is ready on 127.0.0.1:$((KC_PORT + i))"
        continue
      fi
      if ! cl_pid_alive "$(cl_pid "node-$i")"; then
        say "node-$i stopped while starting; last lines of $CL_LOGS/node-$i.log:" >&2
        tail -15 "$CL_LOGS/node-$i.log" >&2
        return 1
      fi
      pending=$((pending + 1))
    done
    [ "$pending" -eq 0 ] && return 0
    if [ "$waited" -ge $((READY_TIMEOUT * 2)) ]; then
      for i in $(seq 1 "$nodes"); do
        [ -f "$CL_RUN/node-$i.ready" ] && continue
        say "node-$i did not become ready in $READY_TIMEOUT s (GET /api/health/ready: $(http_code "http://127.0.0.1:$((KC_PORT + i))/api/health/ready" 2)); last lines of $CL_LOGS/node-$i.log:" >&2
        tail -15 "$CL_LOGS/node-$i.log" >&2
      done
      return 1
    fi
    sleep 0.5
    waited=$((waited + 1))
  done
}

# Stops what this cluster started, in order: the balancer, the nodes, Redis, the replica, the primary.
cl_stop_parts() {
  local name pid
  for name in haproxy $(cd "$CL_RUN" 2>/dev/null && ls node-*.pid 2>/dev/null | sed 's/\.pid$//') redis; do
    pid="$(cl_pid "$name")"
    if cl_pid_alive "$pid"; then kill -TERM "$pid" 2>/dev/null || true; fi
  done
  for name in haproxy $(cd "$CL_RUN" 2>/dev/null && ls node-*.pid 2>/dev/null | sed 's/\.pid$//') redis; do
    pid="$(cl_pid "$name")"
    for _ in $(seq 1 80); do cl_pid_alive "$pid" || break; sleep 0.25; done
    if cl_pid_alive "$pid"; then say "$name did not stop in 20 s: killing it"; kill -KILL "$pid" 2>/dev/null || true; fi
    rm -f "$CL_RUN/$name.pid" "$CL_RUN/$name.ready"
  done
  if [ -f "$REPLICA_PID" ]; then
    pid="$(cat "$REPLICA_PID")"
    kill -TERM "$pid" 2>/dev/null || true
    for _ in $(seq 1 120); do kill -0 "$pid" 2>/dev/null || break; sleep 0.25; done
    rm -f "$REPLICA_PID"
  fi
  db_stop
}

cluster_start() {
  local nodes=2 reseed=0
  while [ "$#" -gt 0 ]; do
    case "$1" in
      --nodes) [ "$#" -ge 2 ] || die "--nodes needs a number from 1 to 8"; nodes="$2"; shift 2 ;;
      --nodes=*) nodes="${1#--nodes=}"; shift ;;
      --reseed) reseed=1; shift ;;
      -h | --help) cluster_usage; return 0 ;;
      *) die "unknown option '$1' for cluster start (see bin/kilocycle cluster --help)" ;;
    esac
  done
  [[ "$nodes" =~ ^[1-8]$ ]] || die "--nodes must be a whole number from 1 to 8 (got '$nodes')"
  export KC_DB_REPLICA_PORT="${KC_DB_REPLICA_PORT:-3318}" KC_REDIS_PORT="${KC_REDIS_PORT:-6380}"
  local sup
  sup="$(cl_pid supervisor)"
  cl_pid_alive "$sup" && die "a cluster is already running from this var/ (process $sup): bin/kilocycle cluster stop first"
  mkdir -p "$VAR"
  check_node
  apt_ensure "${DEBIAN_PACKAGES[@]}" "${CLUSTER_PACKAGES[@]}"
  local tool
  for tool in haproxy redis-server redis-cli mariadb-backup curl; do
    command -v "$tool" >/dev/null 2>&1 || die "$tool is not installed: apt-get install -y ${CLUSTER_PACKAGES[*]} curl (as root), then try again"
  done
  cl_primary_free
  cl_check_ports "$nodes"
  npm_ensure
  build_ensure
  mkdir -p "$CL_LOGS" "$CL_RUN"
  rm -f "$CL_RUN"/*.pid "$CL_RUN"/*.ready
  echo $$ >"$CL_RUN/supervisor.pid"
  printf 'NODES=%s\nKC_PORT=%s\nKC_DB_PORT=%s\nKC_DB_REPLICA_PORT=%s\nKC_REDIS_PORT=%s\nSTARTED=%s\n' "$nodes" "$KC_PORT" \
    "$KC_DB_PORT" "$KC_DB_REPLICA_PORT" "$KC_REDIS_PORT" "$(date -u +%FT%TZ)" >"$CL_STATE"

  local stopping=0
  # shellcheck disable=SC2317
  cl_on_signal() {
    trap - INT TERM
    stopping=1
    say ""
    say "Stopping the cluster …"
    cl_stop_parts
    rm -f "$CL_RUN/supervisor.pid"
    say "Stopped. Data is kept in $VAR."
    exit 0
  }
  # shellcheck disable=SC2317
  cl_fail() {
    trap - INT TERM
    say "Stopping what was started …" >&2
    cl_stop_parts
    rm -f "$CL_RUN/supervisor.pid"
    exit 1
  }
  trap cl_on_signal INT TERM

  cl_keys
  ( cl_primary_start ) || cl_fail
  db_buffer_pool
  node_cli migrate || { say "migrations failed; see the message above" >&2; cl_fail; }
  node_cli seed || { say "loading the demo data failed; see the message above" >&2; cl_fail; }
  if [ "$reseed" = 1 ] || [ ! -d "$REPLICA_DATA/mysql" ]; then ( cl_replica_seed ) || cl_fail; fi
  ( cl_replica_start ) || cl_fail
  say "Replica is replicating on 127.0.0.1:$KC_DB_REPLICA_PORT (GTID, read-only)"
  ( cl_redis_start ) || cl_fail
  say "Redis is up on 127.0.0.1:$KC_REDIS_PORT"
  local public="${KC_PUBLIC_URL:-http://127.0.0.1:$KC_PORT}" i
  for i in $(seq 1 "$nodes"); do cl_node_start "$i" "$public"; done
  cl_nodes_ready "$nodes" || { say "A node did not start: see above; the whole log is in $CL_LOGS" >&2; cl_fail; }
  ( cl_haproxy_config "$nodes" && cl_haproxy_start ) || cl_fail

  say ""
  say "Kilocycle is running on $nodes nodes: http://127.0.0.1:$KC_PORT   (Ctrl-C stops everything)"
  say "  haproxy stats: http://127.0.0.1:$((KC_PORT + 9))/   logs: $CL_LOGS   status: bin/kilocycle cluster status"
  if [ "${KC_MODE:-demo}" = demo ]; then
    say "Demo accounts (password kilocycle-demo):"
    node_cli accounts
  fi

  # Watch: say once when a part stops by itself (the others keep serving); Ctrl-C or cluster stop ends all.
  local -A gone=()
  local name pid log
  while [ "$stopping" = 0 ]; do
    for name in primary replica haproxy redis $(seq -f 'node-%g' 1 "$nodes"); do
      case "$name" in
        primary) pid="$(cat "$DB_PID" 2>/dev/null || true)"; log="$DB_LOG" ;;
        replica) pid="$(cat "$REPLICA_PID" 2>/dev/null || true)"; log="$CL_LOGS/replica.log" ;;
        *) pid="$(cl_pid "$name")"; log="$CL_LOGS/$name.log" ;;
      esac
      if [ -z "${gone[$name]:-}" ] && ! cl_pid_alive "$pid"; then
        gone[$name]=1
        say "$name has stopped by itself (the rest keeps running; Ctrl-C stops it all); the last lines of $log:" >&2
        tail -5 "$log" >&2 || true
      fi
    done
    sleep 2 &
    wait $! || true
  done
}

cluster_status() {
  if [ ! -f "$CL_STATE" ]; then
    say "No cluster has been started from $VAR (bin/kilocycle cluster start)"
    exit 3
  fi
  local NODES KC_PORT KC_DB_PORT KC_DB_REPLICA_PORT KC_REDIS_PORT STARTED
  # shellcheck disable=SC1090
  source "$CL_STATE"
  local ok=0 sup
  sup="$(cl_pid supervisor)"
  if cl_pid_alive "$sup"; then say "Cluster of $NODES nodes started $STARTED (process $sup), from $VAR:"
  else say "No cluster is running from $VAR (the last one, of $NODES nodes, started $STARTED); what is left:"; ok=1; fi

  if db_running; then
    say "  primary MariaDB   127.0.0.1:$KC_DB_PORT  running; binlog $( [ "$(db_sql -N -e 'SELECT @@log_bin')" = 1 ] && echo on || echo OFF), GTID position $(db_sql -N -e 'SELECT @@gtid_binlog_pos')"
  else say "  primary MariaDB   127.0.0.1:$KC_DB_PORT  NOT RUNNING (log: $DB_LOG)"; ok=1; fi

  cl_replica_words || ok=1

  if [ "$(redis-cli -h 127.0.0.1 -p "$KC_REDIS_PORT" ping 2>/dev/null)" = PONG ]; then
    say "  Redis             127.0.0.1:$KC_REDIS_PORT  answers PING"
  else say "  Redis             127.0.0.1:$KC_REDIS_PORT  NOT ANSWERING (log: $CL_LOGS/redis.log)"; ok=1; fi

  local i port body code
  for i in $(seq 1 "$NODES"); do
    port=$((KC_PORT + i))
    body="$(curl -s -m 3 -w '\n%{http_code}' "http://127.0.0.1:$port/api/health/ready" 2>/dev/null || true)"
    code="${body##*$'\n'}"
    body="${body%$'\n'*}"
    if [ "$code" = 200 ]; then
      say "  node-$i            127.0.0.1:$port  ready ($(cl_health_words "$body"))"
    elif [ -n "$code" ] && [ "$code" != 000 ]; then
      say "  node-$i            127.0.0.1:$port  NOT READY, /api/health/ready answers $code ($(cl_health_words "$body")); log: $CL_LOGS/node-$i.log"; ok=1
    else
      say "  node-$i            127.0.0.1:$port  NOT ANSWERING (log: $CL_LOGS/node-$i.log)"; ok=1
    fi
  done

  code="$(http_code "http://127.0.0.1:$KC_PORT/api/health/ready")"
  if [ "$code" = 200 ]; then
    local servers
    servers="$(curl -s -m 3 "http://127.0.0.1:$((KC_PORT + 9))/;csv" 2>/dev/null | awk -F, '$1 == "nodes" && $2 ~ /^node-/ { printf "%s%s %s", sep, $2, $18; sep = ", " }')"
    say "  haproxy           127.0.0.1:$KC_PORT  answers (ready through the balancer); nodes as it sees them: ${servers:-unknown}; stats http://127.0.0.1:$((KC_PORT + 9))/"
  else
    say "  haproxy           127.0.0.1:$KC_PORT  $( [ "$code" = 000 ] || [ -z "$code" ] && echo 'NOT ANSWERING' || echo "answers $code: no node is ready"); log: $CL_LOGS/haproxy.log"; ok=1
  fi
  [ "$ok" = 0 ] || exit 3
}

# "database up, redis up" from terminus' answer.
cl_health_words() {
  node -e 'try { const b = JSON.parse(process.argv[1]); const all = { ...(b.info || {}), ...(b.error || {}) };
    console.log(Object.entries(all).map(([k, v]) => k + " " + v.status + (v.message ? " (" + v.message + ")" : "")).join(", ") || b.status); }
    catch { console.log("no health answer"); }' "$1"
}

cluster_stop() {
  local sup
  sup="$(cl_pid supervisor)"
  if cl_pid_alive "$sup"; then
    say "Stopping the cluster (process $sup) …"
    kill -TERM "$sup"
    for _ in $(seq 1 240); do cl_pid_alive "$sup" || break; sleep 0.25; done
    cl_pid_alive "$sup" && die "the cluster's process $sup did not stop in 60 s; see $CL_LOGS"
    say "Stopped."
  else
    # Its starter is gone (killed?): stop what it left behind from the pid files.
    [ -f "$CL_STATE" ] && { local NODES KC_PORT KC_DB_PORT KC_DB_REPLICA_PORT KC_REDIS_PORT STARTED; source "$CL_STATE"; }
    cl_stop_parts
    rm -f "$CL_RUN/supervisor.pid"
    say "No cluster was running from $VAR; stopped anything it had left"
  fi
}
