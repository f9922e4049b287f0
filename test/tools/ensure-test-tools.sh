#!/usr/bin/env bash
# Makes sure the outside tools the tests use are on this machine: redis-server (the queue tests
# start their own on a free port) and ngspice (the engine is checked against it). On a machine
# where we are root and apt-get exists, missing ones are installed from Debian's packages;
# elsewhere the script names what to install and stops.
set -euo pipefail

missing=()
command -v redis-server >/dev/null 2>&1 || missing+=(redis-server)
command -v ngspice >/dev/null 2>&1 || missing+=(ngspice)

if [ ${#missing[@]} -eq 0 ]; then
  exit 0
fi

if [ "$(id -u)" -eq 0 ] && command -v apt-get >/dev/null 2>&1; then
  echo "ensure-test-tools: installing ${missing[*]} from Debian's packages" >&2
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq "${missing[@]}" >/dev/null
else
  echo "ensure-test-tools: the tests need: ${missing[*]}." >&2
  echo "Install them with your package manager (Debian/Ubuntu: sudo apt-get install ${missing[*]})." >&2
  exit 1
fi
