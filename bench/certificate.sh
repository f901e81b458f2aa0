#!/usr/bin/env bash
# Times a whole `lctkit bound - --json` (parse, Newton polyhedron, distance,
# certificate, report) against `glpsol --exact` on the distance LP alone (the
# same ray-shooting LP over the support of K, written by bench/newtondist -write-lp),
# on the research-scale families of the certificate:
#
#   squares_d10_n100      100 squared monomials in 10 variables (exponents ≤ 12)
#   squares_d10_n10000    10^4 squared monomials in 10 variables
#   squares_d20_n100000   10^5 squared monomials in 20 variables
#   degree_d10_D10        Σ x^(2e) over all e of degree 10 in 10 variables (92,378 terms)
#   lowrank_3_3_3         ‖BA‖² expanded, B 3×3, A 3×3 (18 variables)
#   lowrank_5_5_2         ‖BA‖² expanded, B 5×2, A 2×5 (20 variables)
#   lowrank_4_4_3         ‖BA‖² expanded, B 4×3, A 3×4 (24 variables)
#
# For each it prints wall and CPU seconds (least of REPEAT runs), lctkit's peak
# resident memory, the JSON report's size, lctkit's status and λ, the
# distance t of both tools (glpsol prints its optimum as a decimal), and the
# ratio glpsol/lctkit of wall times. The script installs nothing; without
# glpsol (apt-get install glpk-utils) its columns read n/a.
#
# Usage: bench/certificate.sh [instance ...]
# Environment: TIMEOUT (seconds per run, default 120), REPEAT (default 3),
# OUT (default bench/out).
set -euo pipefail
cd "$(dirname "$0")/.."
OUT=${OUT:-bench/out}
TIMEOUT=${TIMEOUT:-120}
REPEAT=${REPEAT:-3}
mkdir -p "$OUT/cert"
go build -o "$OUT/lctkit" ./cmd/lctkit
go build -o "$OUT/newtondist" ./bench/newtondist
go build -o "$OUT/bounds" ./bench/bounds

if [ $# -gt 0 ]; then
	INSTANCES=("$@")
else
	INSTANCES=(squares_d10_n100 squares_d10_n10000 squares_d20_n100000 degree_d10_D10
		lowrank_3_3_3 lowrank_5_5_2 lowrank_4_4_3)
fi

gen() { # gen NAME: writes $OUT/cert/NAME.k and NAME.pts
	local name=$1 k="$OUT/cert/$1.k" p="$OUT/cert/$1.pts"
	[ -s "$k" ] && [ -s "$p" ] && return
	case $name in
	squares_d*_n*)
		local d=${name#squares_d}; d=${d%%_*}
		local n=${name##*_n}
		"$OUT/bounds" -family squares -vars "$d" -terms "$n" -seed 1 -k "$k" -points "$p" ;;
	degree_d*_D*)
		local d=${name#degree_d}; d=${d%%_*}
		local D=${name##*_D}
		"$OUT/bounds" -family degree -vars "$d" -deg "$D" -k "$k" -points "$p" ;;
	lowrank_*_*_*)
		IFS=_ read -r _ m n h <<<"$name"
		"$OUT/bounds" -family lowrank -m "$m" -n "$n" -h "$h" -k "$k" -points "$p" ;;
	*) echo "unknown instance $name" >&2; exit 2 ;;
	esac
}

# timed OUTFILE CMD...: runs CMD REPEAT times (once if it takes over 10 s) and
# sets WALL, CPU (least of the runs) and RSS (largest, in MB); stdout goes to
# OUTFILE, stdin is $STDIN.
timed() {
	local outfile=$1 k e c r
	shift
	WALL="" CPU="" RSS=0
	for ((k = 0; k < REPEAT; k++)); do
		set +e
		/usr/bin/time -f "%e %U %S %M" -o "$OUT/cert/.time" timeout "$TIMEOUT" "$@" <"$STDIN" >"$outfile"
		local rc=$?
		set -e
		if [ "$rc" = 124 ]; then
			WALL=">$TIMEOUT" CPU="-"
			return
		fi
		read -r e c r < <(awk 'END { printf "%.3f %.3f %.0f\n", $1, $2 + $3, $4 / 1024 }' "$OUT/cert/.time")
		if [ -z "$WALL" ] || awk -v a="$e" -v b="$WALL" 'BEGIN { exit !(a < b) }'; then WALL=$e; fi
		if [ -z "$CPU" ] || awk -v a="$c" -v b="$CPU" 'BEGIN { exit !(a < b) }'; then CPU=$c; fi
		[ "$r" -gt "$RSS" ] && RSS=$r
		if awk -v a="$e" 'BEGIN { exit !(a > 10) }'; then break; fi
	done
	return 0
}

jfield() { sed -n "s/.*\"$1\":\"\\([^\"]*\\)\".*/\\1/p" "$2" | head -1; }

printf '%-22s %8s | %14s %7s %9s %-12s %-10s %-14s | %14s %-14s %7s\n' \
	instance terms "lctkit s" "MB" "report" status lambda "t" "glpsol s" "glpsol t" ratio
for name in "${INSTANCES[@]}"; do
	gen "$name"
	k="$OUT/cert/$name.k" p="$OUT/cert/$name.pts"
	terms=$(sed -n '1s/^[0-9]* //p' "$p")
	STDIN=$k timed "$OUT/cert/$name.json" "$OUT/lctkit" bound - --json
	lw=$WALL lc=$CPU lrss=$RSS
	size=$(wc -c <"$OUT/cert/$name.json")
	st=$(jfield status "$OUT/cert/$name.json")
	lam=$(jfield lambda "$OUT/cert/$name.json")
	dist=$(jfield distance "$OUT/cert/$name.json")
	gw=n/a gc=- gt=n/a ratio=-
	if command -v glpsol >/dev/null; then
		"$OUT/newtondist" -write-lp "$p" >"$OUT/cert/$name.lp"
		STDIN=/dev/null timed /dev/null glpsol --exact --lp "$OUT/cert/$name.lp" -o "$OUT/cert/$name.glp"
		gw=$WALL gc=$CPU
		gt=$(sed -n 's/^Objective: *obj = *\([^ ]*\).*/\1/p' "$OUT/cert/$name.glp" 2>/dev/null || true)
		ratio=$(awk -v a="$gw" -v b="$lw" 'BEGIN { if (a ~ /^>/ || b ~ /^>/ || b == 0) print "-"; else printf "%.1f", a / b }')
	fi
	printf '%-22s %8s | %14s %7s %9s %-12s %-10s %-14s | %14s %-14s %7s\n' \
		"$name" "$terms" "$lw/$lc" "$lrss" "$size" "$st" "$lam" "$dist" "$gw/$gc" "$gt" "$ratio"
done
echo "times: wall/cpu seconds, least of $REPEAT runs; MB: lctkit's peak resident memory; report: bytes of JSON."
echo "t: lctkit's exact distance of P(K) (glpsol's LP is over the same support: the same t). Ratio: glpsol/lctkit wall."
echo "Load average at the end: $(cut -d' ' -f1-3 /proc/loadavg)"
