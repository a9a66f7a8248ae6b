#!/usr/bin/env bash
# Installs the HDL tools the real-tool tests (tests/hdl) run: Icarus Verilog, GHDL, Yosys, Verilator,
# plus gcc for the C export. Idempotent and non-interactive; does nothing when every tool is present.
set -euo pipefail
export DEBIAN_FRONTEND=noninteractive
need=()
for pair in iverilog:iverilog vvp:iverilog ghdl:ghdl yosys:yosys verilator:verilator gcc:gcc; do
    tool=${pair%%:*}; pkg=${pair##*:}
    command -v "$tool" >/dev/null 2>&1 || need+=("$pkg")
done
if [ ${#need[@]} -eq 0 ]; then
    echo "install-hdl-tools: all present"
    exit 0
fi
# De-duplicate (iverilog provides both iverilog and vvp).
mapfile -t pkgs < <(printf '%s\n' "${need[@]}" | sort -u)
SUDO=""
if [ "$(id -u)" != 0 ]; then
    command -v sudo >/dev/null 2>&1 || { echo "install-hdl-tools: need root or sudo to install: ${pkgs[*]}" >&2; exit 1; }
    SUDO="sudo -n"
fi
echo "install-hdl-tools: installing ${pkgs[*]}"
$SUDO apt-get update -qq
$SUDO apt-get install -y -qq --no-install-recommends "${pkgs[@]}" >/dev/null
for tool in iverilog vvp ghdl yosys verilator gcc; do
    command -v "$tool" >/dev/null 2>&1 || { echo "install-hdl-tools: still missing: $tool" >&2; exit 1; }
done
echo "install-hdl-tools: done"
