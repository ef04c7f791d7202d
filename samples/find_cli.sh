# Sourced by the samples/make_*.sh scripts: sets `here` (this folder) and
# `cli` (an absolute path to earmark-cli) from the script's first argument,
# else the release build, else earmark-cli on PATH; exits when none is found.
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
cli="${1:-$here/../build/release/app/cli/earmark-cli}"
if [[ ! -x "$cli" ]]; then
    cli="$(command -v earmark-cli || true)"
fi
if [[ -z "$cli" ]]; then
    echo "$(basename "$0"): earmark-cli not found; build it (scripts/build release) or pass its path" >&2
    exit 1
fi
