#!/usr/bin/env bash
# Installs dependencies with the pinned pnpm; the only prerequisite is Node.js 20 with npm.
source "$(dirname "$0")/lib/common.sh"
bootstrap_dependencies
