#!/bin/sh
# Rebuilds the demo dumps from the HDL in samples/hdl with Icarus Verilog (iverilog + vvp).
#   sensor_hub.vcd       typical delays (iverilog -T typ), the dump the viewer opens by default
#   sensor_hub_slow.vcd  the same stimulus at the slow corner (iverilog -T max)
#   sensor_hub.vcd.gz    sensor_hub.vcd compressed with gzip, to exercise .vcd.gz reading
# Usage: sh samples/regenerate.sh   (from any directory)
set -eu

here=$(cd "$(dirname "$0")" && pwd)
for tool in iverilog vvp gzip; do
  command -v "$tool" >/dev/null 2>&1 || { echo "regenerate.sh: '$tool' is not installed (Debian: apt-get install iverilog gzip)" >&2; exit 2; }
done

work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

corner() { # corner <min|typ|max> <output file>
  iverilog -g2005 -Wall -Wno-timescale -T "$1" -s hub_bench -o "$work/hub_$1.vvp" \
    "$here/hdl/sensor_hub.v" "$here/hdl/hub_bench.v"
  (cd "$work" && vvp -n "hub_$1.vvp" >/dev/null)
  mv "$work/sensor_hub.vcd" "$here/$2"
  echo "wrote samples/$2 ($(wc -c <"$here/$2") bytes, $1 delays)"
}

corner typ sensor_hub.vcd
corner max sensor_hub_slow.vcd
gzip -9 -n -c "$here/sensor_hub.vcd" >"$here/sensor_hub.vcd.gz"
echo "wrote samples/sensor_hub.vcd.gz ($(wc -c <"$here/sensor_hub.vcd.gz") bytes)"
