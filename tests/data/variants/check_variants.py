#!/usr/bin/env python3
"""Run mainscheck on the drawing-variant corpus and compare with the ngspice reference values.

For every deck in expected.json:  mainscheck check --format json --corners nominal DECK
PASS when a block of the expected kind exists whose first output (net, return) is the expected
pair and whose v_dc is within 3 % of the ngspice mean.  For a DC output the pair may come
reversed only with the sign: (return, net) is compared against the negated mean.  For an AC
output (the dividers) either order is accepted and, since the mean of a sine is ~0, the value
compared is the peak-to-peak voltage (v_ripple_pp against the ngspice peak-to-peak), within 3 %.
The ripple of DC outputs is printed for information only.

known_failures.txt lists decks expected to fail (one file name a line, '#' comments).  The
script exits 1 when a deck not listed fails, or when a listed deck passes (remove it from the
list: the list only shrinks).  MAINSCHECK_VARIANTS_SUBSET=N runs every N-th deck only.

--expected PATH checks another set of decks (e.g. handdrawn/expected.json): its deck files and its
known_failures.txt are taken from the folder of PATH.  The default is expected.json next to this script.

    check_variants.py [--mainscheck PATH] [--expected PATH] [--markdown] [--jobs N] [--verbose] [--write-known]
"""

import argparse
import json
import os
import subprocess
import sys
from concurrent.futures import ThreadPoolExecutor

HERE = os.path.dirname(os.path.abspath(__file__))
TOL = 0.03


def default_binary():
    root = os.path.abspath(os.path.join(HERE, "..", "..", ".."))
    return os.path.join(root, "build", "mainscheck")


def load_known(path):
    known = set()
    if os.path.exists(path):
        with open(path) as f:
            for line in f:
                line = line.split("#", 1)[0].strip()
                if line:
                    known.add(line)
    return known


def run_one(binary, entry, base=HERE):
    deck = os.path.join(base, entry["file"])
    try:
        r = subprocess.run([binary, "check", "--format", "json", "--corners", "nominal", deck],
                           capture_output=True, text=True, timeout=300)
    except subprocess.TimeoutExpired:
        return "timeout", None, None
    if r.returncode < 0:
        return "mainscheck crashed (signal %d)" % -r.returncode, None, None
    try:
        doc = json.loads(r.stdout)
    except ValueError:
        msg = (r.stderr.strip().splitlines() or ["no output"])[-1]
        return "no JSON (exit %d): %s" % (r.returncode, msg[:120]), None, None
    return None, doc, r.returncode


def judge(entry, doc):
    """Returns (passed, reason, info)."""
    exp = entry["output"]
    net, ret, ac = exp["net"].upper(), exp["return"].upper(), exp.get("ac", False)
    ref = entry.get("ngspice")
    if ref is None:
        return False, "no ngspice reference (run generate.py --ngspice)", ""
    if doc.get("status") != "complete":
        fail = doc.get("failure")
        extra = ""
        if not doc.get("blocks"):
            return False, "status %s: %s" % (doc.get("status"), str(fail)[:100]), ""
        extra = " (status %s)" % doc.get("status")
    else:
        extra = ""
    blocks = doc.get("blocks") or []
    same_kind = [b for b in blocks if b.get("kind") == entry["kind"]]
    if not blocks:
        return False, "no block" + extra, ""
    if not same_kind:
        kinds = sorted(set("%s/%s" % (b.get("kind"), b.get("variant")) for b in blocks))
        return False, "wrong kind (found %s)%s" % (", ".join(kinds), extra), ""
    best = None
    for b in same_kind:
        outs = b.get("outputs") or []
        if not outs:
            best = best or ("no outputs", None)
            continue
        o = outs[0]
        onet, oret = str(o.get("net")).upper(), str(o.get("return")).upper()
        sign = None
        if (onet, oret) == (net, ret):
            sign = 1.0
        elif (onet, oret) == (ret, net):
            sign = 1.0 if ac else -1.0
        if sign is None:
            best = best or ("wrong nets (%s, %s)" % (o.get("net"), o.get("return")), None)
            continue
        if ac:
            got, want, what = o.get("v_ripple_pp"), ref["v_ripple_pp"], "v_pp"
        else:
            got, want, what = o.get("v_dc"), sign * ref["v_mean"], "v_dc"
        if got is None:
            return False, "block and nets right; %s is null%s" % (what, extra), ""
        err = (got - want) / abs(want) if want else float("inf")
        rip = o.get("v_ripple_pp")
        info = "%s %.4g vs ngspice %.4g (%+.1f %%)" % (what, got, want, 100 * err)
        if not ac and rip is not None and ref.get("v_ripple_pp"):
            info += "; ripple %.3g vs %.3g" % (rip, ref["v_ripple_pp"])
        if abs(err) <= TOL:
            return True, "", info
        return False, "value off by %+.1f %% (%s %.4g, ngspice %.4g)%s" % (100 * err, what, got, want, extra), info
    return False, (best[0] if best else "no outputs") + extra, ""


def print_matrix(rows):
    """Drawing-variant rows x topology columns; each cell 'passing/instances', blank when not drawn."""
    variants, cells = [], {}
    for topo, var, status, _, _ in rows:
        v = var.split("/")[0]
        if v not in variants:
            variants.append(v)
        c = cells.setdefault((topo, v), [0, 0])
        c[0] += status == "PASS"
        c[1] += 1
    topos = list(dict.fromkeys(r[0] for r in rows))
    print("| variant | " + " | ".join(topos) + " |")
    print("|---|" + "---|" * len(topos))
    for v in variants:
        line = []
        for t in topos:
            c = cells.get((t, v))
            line.append("" if c is None else "%d/%d" % (c[0], c[1]))
        print("| %s | %s |" % (v, " | ".join(line)))


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--mainscheck", default=default_binary(), help="path of the mainscheck binary")
    ap.add_argument("--expected", default=os.path.join(HERE, "expected.json"),
                    help="expectations file; decks and known_failures.txt are read from its folder")
    ap.add_argument("--markdown", action="store_true", help="print the result table as Markdown")
    ap.add_argument("--matrix", action="store_true",
                    help="print a compact Markdown matrix: topology x drawing variant, passing/all instances")
    ap.add_argument("--jobs", type=int, default=os.cpu_count() or 1)
    ap.add_argument("--write-known", action="store_true",
                    help="rewrite known_failures.txt with exactly the decks failing now (baseline)")
    ap.add_argument("--verbose", action="store_true", help="print the value comparison of passing decks too")
    args = ap.parse_args()

    if not os.path.exists(args.mainscheck):
        print("mainscheck binary not found: %s" % args.mainscheck, file=sys.stderr)
        return 2
    base = os.path.dirname(os.path.abspath(args.expected))
    with open(args.expected) as f:
        entries = json.load(f)["decks"]
    subset = int(os.environ.get("MAINSCHECK_VARIANTS_SUBSET", "1") or "1")
    if subset > 1:
        entries = entries[::subset]
    known = load_known(os.path.join(base, "known_failures.txt"))

    def work(e):
        err, doc, _ = run_one(args.mainscheck, e, base)
        if err:
            return e, False, err, ""
        ok, reason, info = judge(e, doc)
        return e, ok, reason, info

    with ThreadPoolExecutor(max_workers=max(1, args.jobs)) as pool:
        results = list(pool.map(work, entries))

    unexpected_fail, unexpected_pass = [], []
    rows = []
    for e, ok, reason, info in results:
        listed = e["file"] in known
        if not ok and not listed:
            unexpected_fail.append(e["file"])
        if ok and listed:
            unexpected_pass.append(e["file"])
        status = "PASS" if ok else ("FAIL (known)" if listed else "FAIL")
        rows.append((e["topology"], e["variant"], status, reason if not ok else (info if args.verbose else ""), e["file"]))

    # per-topology counts
    summary = {}
    for topo, _, status, _, _ in rows:
        s = summary.setdefault(topo, [0, 0])
        s[0 if status == "PASS" else 1] += 1

    if args.matrix:
        print_matrix(rows)
    elif args.markdown:
        print("| topology | variant | result | reason |")
        print("|---|---|---|---|")
        for topo, var, status, reason, _ in rows:
            print("| %s | %s | %s | %s |" % (topo, var, status, reason.replace("|", "/")))
        print()
        print("| topology | pass | fail |")
        print("|---|---|---|")
        for topo, (p, fl) in summary.items():
            print("| %s | %d | %d |" % (topo, p, fl))
    else:
        w1 = max(len(r[0]) for r in rows)
        w2 = max(len(r[1]) for r in rows)
        for topo, var, status, reason, _ in rows:
            print("%-*s  %-*s  %-12s  %s" % (w1, topo, w2, var, status, reason))
        print()
        for topo, (p, fl) in summary.items():
            print("%-*s  pass %3d  fail %3d" % (w1, topo, p, fl))
    total_pass = sum(s[0] for s in summary.values())
    print("\n%d decks: %d pass, %d fail (%d listed in known_failures.txt)"
          % (len(rows), total_pass, len(rows) - total_pass, len(known)), file=sys.stderr)
    if args.write_known:
        if subset > 1:
            print("--write-known needs the whole corpus (unset MAINSCHECK_VARIANTS_SUBSET)", file=sys.stderr)
            return 2
        with open(os.path.join(base, "known_failures.txt"), "w") as f:
            f.write("# Decks of the variant corpus that fail against the current build (one file name a line).\n"
                    "# check_variants.py fails on a deck that fails and is not listed, and on a listed deck that\n"
                    "# now passes: remove it when a fix makes it pass (the list only shrinks).\n"
                    "# Baseline written by check_variants.py --write-known; the reason follows each name.\n")
            for topo, var, status, reason, fname in rows:
                if status != "PASS":
                    f.write("%s  # %s\n" % (fname, reason))
        print("known_failures.txt rewritten", file=sys.stderr)
        return 0
    rc = 0
    if unexpected_fail:
        rc = 1
        print("\nNEW FAILURES (not in known_failures.txt):", file=sys.stderr)
        for f in unexpected_fail:
            print("  " + f, file=sys.stderr)
    if unexpected_pass:
        rc = 1
        print("\nNOW PASSING (remove from known_failures.txt):", file=sys.stderr)
        for f in unexpected_pass:
            print("  " + f, file=sys.stderr)
    return rc


if __name__ == "__main__":
    sys.exit(main())
