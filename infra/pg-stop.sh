#!/usr/bin/env bash
# Stop the project's PostgreSQL cleanly.
source "$(dirname "$0")/lib.sh"
stop_postgres
