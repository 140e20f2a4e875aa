#!/usr/bin/env bash
# Private MariaDB on loopback for Takeproof. Sourced by start.sh and test.sh.
# Needs: DB_DATA_DIR, DB_PORT, DB_NAME, DB_USER, DB_PASSWORD.

ensure_debian_packages() {
  # $@: Debian package names whose main command is missing. Installs them with apt-get.
  local missing=("$@")
  [ ${#missing[@]} -eq 0 ] && return 0
  if [ "$(id -u)" != "0" ]; then
    echo "Takeproof needs these Debian packages: ${missing[*]}." >&2
    echo "Run as root, or install them with: sudo apt-get install -y ${missing[*]}" >&2
    return 1
  fi
  echo "Installing Debian packages: ${missing[*]} (once per machine)…"
  if [ ! -f /var/lib/apt/periodic/takeproof-updated ] || [ -z "$(ls -A /var/lib/apt/lists 2>/dev/null | grep -v lock)" ]; then
    apt-get update -qq -o DPkg::Lock::Timeout=600 >/dev/null && mkdir -p /var/lib/apt/periodic && touch /var/lib/apt/periodic/takeproof-updated
  fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq -o DPkg::Lock::Timeout=600 "${missing[@]}" >/dev/null
}

db_socket() { echo "$DB_DATA_DIR.run/mysqld.sock"; }
# MariaDB resolves relative paths against its own base dir, so the data dir is made absolute.
db_abs_datadir() { case "$DB_DATA_DIR" in /*) ;; *) DB_DATA_DIR="$PWD/$DB_DATA_DIR" ;; esac; }
db_root() { mariadb --no-defaults --socket="$(db_socket)" -uroot "$@"; }

db_start() {
  command -v mariadbd >/dev/null 2>&1 || ensure_debian_packages mariadb-server || return 1
  db_abs_datadir
  local run="$DB_DATA_DIR.run" me
  me="$(id -un)"
  mkdir -p "$run"
  if [ ! -d "$DB_DATA_DIR/mysql" ]; then
    echo "Creating a private MariaDB data directory in $DB_DATA_DIR…"
    mariadb-install-db --no-defaults --datadir="$DB_DATA_DIR" --user="$me" --skip-test-db >"$run/install.log" 2>&1 \
      || { echo "MariaDB could not initialise $DB_DATA_DIR; see $run/install.log" >&2; return 1; }
  fi
  if (exec 3<>"/dev/tcp/127.0.0.1/$DB_PORT") 2>/dev/null; then
    echo "Port $DB_PORT is already taken; set DB_PORT to a free port." >&2
    return 1
  fi
  mariadbd --no-defaults --user="$me" --datadir="$DB_DATA_DIR" --socket="$(db_socket)" \
    --pid-file="$run/mysqld.pid" --log-error="$run/error.log" --port="$DB_PORT" \
    --bind-address=127.0.0.1 --skip-name-resolve --innodb-buffer-pool-size=256M &
  DB_PID=$!
  for _ in $(seq 1 120); do
    mariadb-admin --no-defaults --socket="$(db_socket)" -uroot ping >/dev/null 2>&1 && break
    kill -0 "$DB_PID" 2>/dev/null || { echo "MariaDB did not start; see $run/error.log" >&2; return 1; }
    sleep 0.25
  done
  db_root -e "CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
    CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
    ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
    GRANT ALL ON \`$DB_NAME\`.* TO '$DB_USER'@'127.0.0.1'; FLUSH PRIVILEGES;" \
    || { echo "Could not create the database $DB_NAME" >&2; return 1; }
  echo "MariaDB is up on 127.0.0.1:$DB_PORT (data in $DB_DATA_DIR)."
}

db_stop() {
  [ -n "${DB_PID:-}" ] || return 0
  mariadb-admin --no-defaults --socket="$(db_socket)" -uroot shutdown >/dev/null 2>&1 || kill "$DB_PID" 2>/dev/null
  for _ in $(seq 1 120); do kill -0 "$DB_PID" 2>/dev/null || break; sleep 0.25; done
  kill -0 "$DB_PID" 2>/dev/null && kill -9 "$DB_PID" 2>/dev/null
  DB_PID=
}
