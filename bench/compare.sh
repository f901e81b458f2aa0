#!/usr/bin/env bash
# Times lctkit's exact Newton distance + face (and its facet enumeration)
# against general-purpose exact tools on the same instances, τ = (1,…,1):
#
#   glpsol --exact   the same ray-shooting LP over all N points (CPLEX LP format)
#   lrs, scdd_gmp    facet enumeration of the V-form (Pareto-minimal points plus
#                    the d unit rays), then t = max over facets of b/(a·τ)
#
# The lctkit facet column runs on the same Pareto-minimal points as lrs and cdd
# (the distance column on all N points, like glpsol).
# Times are whole-process wall seconds of the tool alone (writing its input
# and reading its output are not timed), with the CPU seconds (user+system)
# beside them, which are less sensitive to a busy machine. Pareto filtering is done for lrs and
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
		degree_d3_D20 degree_d5_D8 degree_d8_D5 degree_d10_D10)
fi

have() { command -v "$1" >/dev/null 2>&1; }

# timed CMD...: runs CMD under timeout REPEAT times (once if it times out,
# fails or takes over 5 s) and sets ELAPSED to the least wall time and CPU to
# the least user+system CPU time, in seconds, MEM to the largest peak
# resident set size in MB (the "Maximum resident set size" of time -v), and
# RC. Stdout goes to TIMED_OUT.
timed() {
	local e c m best="" bestc="" mem=0 k
	for ((k = 0; k < REPEAT; k++)); do
		set +e
		/usr/bin/time -f "%e %U %S %M" -o "$OUT/work/.time" timeout "$TIMEOUT" "$@" >"$TIMED_OUT"
		RC=$?
		set -e
		if [ "$RC" = 124 ]; then
			ELAPSED=">$TIMEOUT" CPU="-" MEM="-"
			return
		fi
		read -r e c m < <(awk 'END { printf "%.3f %.3f %.0f\n", $1, $2 + $3, $4 / 1024 }' "$OUT/work/.time")
		if [ -z "$best" ] || awk -v a="$e" -v b="$best" 'BEGIN { exit !(a < b) }'; then best=$e; fi
		if [ -z "$bestc" ] || awk -v a="$c" -v b="$bestc" 'BEGIN { exit !(a < b) }'; then bestc=$c; fi
		[ "$m" -gt "$mem" ] && mem=$m
		[ "$RC" = 0 ] || break
		awk -v a="$e" 'BEGIN { exit !(a > 5) }' && break # long runs: once is enough
	done
	ELAPSED=$best CPU=$bestc MEM=$mem
}

field() { sed -n "s/.*\b$1=\([^ ]*\).*/\1/p" "$2" | head -1; }
ratio() { awk -v a="$1" -v b="$2" 'BEGIN { if (a ~ /^>/ || b ~ /^>/ || a == "n/a" || b == "n/a" || b == 0) print "-"; else printf "%.1f", a / b }'; }

# Times are "wall/cpu" seconds (least of REPEAT runs each).
printf '%-20s %3s %7s %6s | %13s %6s %-18s %13s %6s | %13s %6s %-13s %5s | %13s %13s %-20s %5s\n' \
	instance d N minimal lctkit MB t lct-facets facets glpsol MB "glpsol t" ratio lrs cdd "t (lrs;cdd)" ratio
for name in "${INSTANCES[@]}"; do
	f="$OUT/inst/$name.txt"
	w="$OUT/work/$name"
	read -r d npts < <(grep -v '^#' "$f" | head -1)
	# lctkit: distance + face
	TIMED_OUT="$w.lct" timed "$ND" "$f"
	lct=$ELAPSED lctc=$CPU lctm=$MEM
	lt=$(field t "$w.lct")
	minimal=$(field minimal "$w.lct")
	# lctkit: facets, on the same Pareto-minimal points that lrs and cdd get
	"$ND" -write-minimal "$f" >"$w.min"
	TIMED_OUT="$w.lctf" timed "$ND" -facets "$w.min"
	lctf=$ELAPSED lctfc=$CPU
	nfac=$(field facets "$w.lctf")
	lft=$(field t "$w.lctf")
	[ -n "$lft" ] && [ "$lft" != "$lt" ] && lt="$lt!=$lft"
	# glpsol --exact on the same LP
	glp=n/a gt=n/a glpc=- glpm=-
	if have glpsol; then
		"$ND" -write-lp "$f" >"$w.lp"
		TIMED_OUT=/dev/null timed glpsol --exact --lp "$w.lp" -o "$w.glp"
		glp=$ELAPSED glpc=$CPU glpm=$MEM
		gt=$(sed -n 's/^Objective: *obj = *\([^ ]*\).*/\1/p' "$w.glp" 2>/dev/null || true)
	fi
	"$ND" -write-generators "$f" >"$w.ext"
	lrs=n/a lrst=- lrsc=-
	if have lrs; then
		TIMED_OUT=/dev/null timed lrs "$w.ext" "$w.lrs.ine" 2>/dev/null
		lrs=$ELAPSED lrsc=$CPU
		[ "$RC" = 0 ] && lrst=$(field t <("$ND" -read-inequalities "$w.lrs.ine") || true)
	fi
	cdd=n/a cddt=- cddc=-
	if have scdd_gmp; then
		rm -f "$w.ine"
		TIMED_OUT=/dev/null timed scdd_gmp "$w.ext" 2>/dev/null
		cdd=$ELAPSED cddc=$CPU
		[ "$RC" = 0 ] && cddt=$(field t <("$ND" -read-inequalities "$w.ine") || true)
	fi
	best=$lrs
	if [ "$lrs" = n/a ] || [[ "$lrs" == \>* ]] || { [ "$cdd" != n/a ] && [[ "$cdd" != \>* ]] && awk -v a="$cdd" -v b="$lrs" 'BEGIN{exit !(a<b)}'; }; then best=$cdd; fi
	printf '%-20s %3s %7s %6s | %13s %6s %-18s %13s %6s | %13s %6s %-13s %5s | %13s %13s %-20s %5s\n' \
		"$name" "$d" "$npts" "$minimal" "$lct/$lctc" "$lctm" "$lt" "$lctf/$lctfc" "${nfac:--}" "$glp/$glpc" "$glpm" "$gt" "$(ratio "$glp" "$lct")" \
		"$lrs/$lrsc" "$cdd/$cddc" "$lrst;$cddt" "$(ratio "$best" "$lctf")"
done
echo "times: wall/cpu seconds (cpu = user+system); MB: peak resident set size; ratios use wall times: glpsol / lctkit distance,"
echo "faster of lrs and cdd / lctkit facets. Load average at the end: $(cut -d' ' -f1-3 /proc/loadavg)"
