#!/usr/bin/env bash
# Screenshots of every page of vigil's window in the light, dark and
# night-red themes, taken from the real window (Fyne's OpenGL driver).
#
#   .ci/screenshots.sh [OUTDIR]      (default: shots)
#
# It builds bin/vigil (or uses $VIGIL_BIN), starts a virtual X display
# (Xvfb :99) when DISPLAY is unset, opens the window on a fresh demo logbook
# in a temporary directory with the capture mode on (VIGIL_SHOTS=OUTDIR:
# every page in every theme, saved as OUTDIR/<page>-<theme>.png, listed in
# OUTDIR/shots.txt, then the window quits), and checks the PNGs: each
# exists, all have one size, none is a flat colour, and the night-red ones
# hold no green or blue at all. The window's pixels are read with ImageMagick's `import`
# (VIGIL_SHOTS_GRAB), since Fyne's own capture reads an OpenGL front buffer
# that Mesa leaves empty under Xvfb. Xvfb and ImageMagick are installed with
# apt-get when missing (through sudo when not root), as `make deps` does.
set -euo pipefail
cd "$(dirname "$0")/.."

out=${1:-shots}
# the brightest red (of 255) a night-red pixel may have, charts included:
# nightMaxRed in app/theme_test.go and app/chart/palette.go.
max_red=200

need=()
command -v Xvfb >/dev/null || need+=(xvfb)
command -v import >/dev/null || need+=(imagemagick)
if [ ${#need[@]} -gt 0 ]; then
	if ! command -v apt-get >/dev/null; then
		echo "screenshots: please install ${need[*]} (Xvfb and ImageMagick)" >&2
		exit 1
	fi
	sudo=""; [ "$(id -u)" = 0 ] || sudo=sudo
	echo "installing: ${need[*]}"
	$sudo apt-get update -qq && DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq "${need[@]}" >/dev/null
fi

tmp=$(mktemp -d)
xvfb_pid=""
cleanup() {
	if [ -n "$xvfb_pid" ]; then
		kill "$xvfb_pid" 2>/dev/null || true
		wait "$xvfb_pid" 2>/dev/null || true
	fi
	rm -rf "$tmp"
}
trap cleanup EXIT

if [ -z "${DISPLAY:-}" ]; then
	Xvfb :99 -screen 0 1600x1000x24 -nolisten tcp >"$tmp/xvfb.log" 2>&1 &
	xvfb_pid=$!
	export DISPLAY=:99
	for _ in $(seq 50); do
		xdpyinfo >/dev/null 2>&1 && break
		[ -e /tmp/.X11-unix/X99 ] && break
		sleep 0.1
	done
fi

bin=${VIGIL_BIN:-}
if [ -z "$bin" ]; then
	go build -o bin/vigil ./cmd/vigil
	bin=bin/vigil
fi

rm -rf "$out"
mkdir -p "$out"
out_abs=$(cd "$out" && pwd)
echo "screenshots: $bin --logbook $tmp/demo.db (DISPLAY=$DISPLAY)"
# The pages show the demo's Algol-like star on a night it was observed (its
# O−C parabola, a fitted minimum); override with VIGIL_SHOTS_STAR/DATE.
: "${VIGIL_SHOTS_STAR:=Ashgrove V4}" "${VIGIL_SHOTS_DATE:=2026-11-05}"
export VIGIL_SHOTS_STAR VIGIL_SHOTS_DATE
if ! VIGIL_SHOTS="$out_abs" VIGIL_SHOTS_GRAB="import -window vigil" \
	timeout 300 "$bin" --logbook "$tmp/demo.db" </dev/null >"$tmp/run.log" 2>&1; then
	cat "$tmp/run.log" >&2
	echo "screenshots: the window failed (log above)" >&2
	exit 1
fi
if [ ! -s "$out/shots.txt" ]; then
	cat "$tmp/run.log" >&2
	echo "screenshots: no $out/shots.txt: $bin did not run the capture mode" >&2
	echo "  (its window entry point must pass app.EnvOptions(), which reads VIGIL_SHOTS)" >&2
	exit 1
fi

fail=0
n=0
while read -r f; do
	[ -n "$f" ] || continue
	n=$((n + 1))
	p="$out/$f"
	if [ ! -s "$p" ]; then
		echo "screenshots: $p is missing or empty" >&2
		fail=1
		continue
	fi
	size=$(identify -format '%wx%h' "$p")
	colours=$(identify -format '%k' "$p")
	first_size=${first_size:-$size}
	if [ "$size" != "$first_size" ] || [ "$colours" -lt 16 ]; then
		echo "screenshots: $p is $size with $colours colours (want $first_size, a drawn window)" >&2
		fail=1
	fi
	case "$f" in
	*-night-red.png)
		rgb=$(convert "$p" -format '%[fx:round(255*maxima.r)] %[fx:round(255*maxima.g)] %[fx:round(255*maxima.b)]' info:)
		read -r r g b <<<"$rgb"
		if [ "$g" != 0 ] || [ "$b" != 0 ] || [ "$r" -gt "$max_red" ]; then
			echo "screenshots: $p is not deep red: brightest red $r, green $g, blue $b" >&2
			fail=1
		fi
		;;
	esac
	echo "  $p  $size"
done <"$out/shots.txt"
[ "$n" -ge 3 ] || { echo "screenshots: only $n shots listed in $out/shots.txt" >&2; fail=1; }
exit $fail
