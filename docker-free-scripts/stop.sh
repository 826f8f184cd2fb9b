#!/usr/bin/env bash
# Stops the project-local PostgreSQL started by start.sh or test.sh.
source "$(dirname "$0")/lib.sh"
pg_stop
