#!/usr/bin/env bash
# Times lctkit's exact Newton distance + face (and its facet enumeration)
# against general-purpose exact tools on the same instances, τ = (1,…,1):
#
#   glpsol --exact   the same ray-shooting LP over all N points (CPLEX LP format)
#   lrs, scdd_gmp    facet enumeration of the V-form (Pareto-minimal points plus
#                    the d unit rays), then t = max over facets of b/(a·τ)
#
# Times are whole-process wall seconds of the tool alone (writing its input
# and reading its output are not timed). Pareto filtering is done for lrs and
# cdd (without it they are 10–100× slower); glpsol gets all points, as lctkit.
# The exact t of every tool is printed so agreement is visible (glpsol prints
# its exact optimum only as a decimal).
#
# The script installs nothing. On Debian: apt-get install lrslib libcdd-tools glpk-utils
# Tools that are missing are reported as "n/a".
#
# Usage: bench/compare.sh [instance ...]    (names as in testdata/polyhedron,
#        without .txt; default: a representative selection)
# Environment: TIMEOUT (seconds per tool run, default 60), REPEAT (runs per
# measurement, the least wall time is reported; default 3), OUT (default bench/out).
set -euo pipefail
cd "$(dirname "$0")/.."
OUT=${OUT:-bench/out}
TIMEOUT=${TIMEOUT:-60}
REPEAT=${REPEAT:-3}
mkdir -p "$OUT/inst" "$OUT/work"
go build -o "$OUT/newtondist" ./bench/newtondist
go run ./polyhedron/internal/gen -all -dir "$OUT/inst"
ND="$OUT/newtondist"

if [ $# -gt 0 ]; then
	INSTANCES=("$@")
else
	INSTANCES=(lowrank_2_2_2 lowrank_3_3_2 lowrank_3_3_3 lowrank_4_4_3 lowrank_5_5_4
		dense_d6_n1000 dense_d6_n10000 dense_d10_n100 dense_d10_n10000
		random_d3_n100000 random_d6_n1000 random_d6_n10000 random_d10_n10000 random_d10_n100000
		random_d15_n100000 random_d20_n1000 random_d20_n10000 random_d20_n100000
		degree_d3_D20 degree_d5_D8 degree_d8_D5)
fi

have() { command -v "$1" >/dev/null 2>&1; }

# timed CMD...: runs CMD under timeout REPEAT times (once if it times out
# or fails) and sets ELAPSED to the least wall time in seconds, and RC.
timed() {
	local t0 t1 e best="" k
	for ((k = 0; k < REPEAT; k++)); do
		t0=$(date +%s.%N)
		set +e
		timeout "$TIMEOUT" "$@"
		RC=$?
		set -e
		t1=$(date +%s.%N)
		if [ "$RC" = 124 ]; then
			ELAPSED=">$TIMEOUT"
			return
		fi
		e=$(awk -v a="$t0" -v b="$t1" 'BEGIN { printf "%.3f", b - a }')
		if [ -z "$best" ] || awk -v a="$e" -v b="$best" 'BEGIN { exit !(a < b) }'; then best=$e; fi
		[ "$RC" = 0 ] || break
		awk -v a="$e" 'BEGIN { exit !(a > 5) }' && break # long runs: once is enough
	done
	ELAPSED=$best
}

field() { sed -n "s/.*\b$1=\([^ ]*\).*/\1/p" "$2" | head -1; }
ratio() { awk -v a="$1" -v b="$2" 'BEGIN { if (a ~ /^>/ || b ~ /^>/ || a == "n/a" || b == "n/a" || b == 0) print "-"; else printf "%.1f", a / b }'; }

printf '%-20s %3s %7s %6s | %8s %-22s %8s %7s | %8s %-14s %6s | %8s %8s %-22s %6s\n' \
	instance d N minimal lctkit t lct-fac facets glpsol "glpsol t" ratio lrs cdd "t (lrs;cdd)" ratio
for name in "${INSTANCES[@]}"; do
	f="$OUT/inst/$name.txt"
	w="$OUT/work/$name"
	read -r d npts < <(grep -v '^#' "$f" | head -1)
	# lctkit: distance + face
	timed "$ND" "$f" >"$w.lct"
	lct=$ELAPSED
	lt=$(field t "$w.lct")
	minimal=$(field minimal "$w.lct")
	# lctkit: facets
	timed "$ND" -facets "$f" >"$w.lctf"
	lctf=$ELAPSED
	nfac=$(field facets "$w.lctf")
	lft=$(field t "$w.lctf")
	[ -n "$lft" ] && [ "$lft" != "$lt" ] && lt="$lt!=$lft"
	# glpsol --exact on the same LP
	glp=n/a gt=n/a
	if have glpsol; then
		"$ND" -lp "$f" >"$w.lp"
		timed glpsol --exact --lp "$w.lp" -o "$w.glp" >/dev/null
		glp=$ELAPSED
		gt=$(sed -n 's/^Objective: *obj = *\([^ ]*\).*/\1/p' "$w.glp" 2>/dev/null || true)
	fi
	"$ND" -ext "$f" >"$w.ext"
	lrs=n/a lrst=-
	if have lrs; then
		timed lrs "$w.ext" "$w.lrs.ine" >/dev/null 2>&1
		lrs=$ELAPSED
		[ "$RC" = 0 ] && lrst=$(field t <("$ND" -ine "$w.lrs.ine") || true)
	fi
	cdd=n/a cddt=-
	if have scdd_gmp; then
		rm -f "$w.ine"
		timed scdd_gmp "$w.ext" >/dev/null 2>&1
		cdd=$ELAPSED
		[ "$RC" = 0 ] && cddt=$(field t <("$ND" -ine "$w.ine") || true)
	fi
	best=$lrs
	if [ "$lrs" = n/a ] || [[ "$lrs" == \>* ]] || { [ "$cdd" != n/a ] && [[ "$cdd" != \>* ]] && awk -v a="$cdd" -v b="$lrs" 'BEGIN{exit !(a<b)}'; }; then best=$cdd; fi
	printf '%-20s %3s %7s %6s | %8s %-22s %8s %7s | %8s %-14s %6s | %8s %8s %-22s %6s\n' \
		"$name" "$d" "$npts" "$minimal" "$lct" "$lt" "$lctf" "${nfac:--}" "$glp" "$gt" "$(ratio "$glp" "$lct")" \
		"$lrs" "$cdd" "$lrst;$cddt" "$(ratio "$best" "$lctf")"
done
echo "ratio columns: glpsol time / lctkit distance time; faster of lrs and cdd / lctkit facet time."
