#!/usr/bin/env python3
"""(Re)compute the ngspice reference values of the hand-drawn decks in this folder.

    python3 measure.py              # measure every deck listed in expected.json, update "ngspice"
    python3 measure.py DECK.cir ... # only these decks

The decks themselves are written by hand (they are not generated); expected.json holds their
hand-written expectations (kind, output pair, mains, rough textbook value).  This script only fills
in the "ngspice" field of each entry: the mean and the peak-to-peak value of v(net) - v(return)
over the last three mains periods of a transient run.  The control deck and the ngspice run are
those of ../generate.py (ngspice_deck, run_ngspice, imported, not copied): same measurement, same
fallback .options when ngspice needs them.  The only thing added here is that `.include`/`.inc`
lines are rewritten to absolute paths in the temporary control deck, since ngspice runs it from a
temporary folder.  The stop time is the deck's own `.tran` stop time; the frequency comes from the
entry's "mains".

Python standard library and ngspice (`ngspice -b`) only.
"""

import argparse
import json
import os
import re
import sys
from concurrent.futures import ThreadPoolExecutor

HERE = os.path.dirname(os.path.abspath(__file__))
sys.dont_write_bytecode = True  # no __pycache__ next to generate.py
sys.path.insert(0, os.path.dirname(HERE))
import generate  # noqa: E402  (../generate.py: ngspice_deck, run_ngspice, sig)

SUFFIX = {"t": 1e12, "g": 1e9, "meg": 1e6, "k": 1e3, "m": 1e-3, "u": 1e-6, "n": 1e-9, "p": 1e-12, "f": 1e-15}


def spice_number(tok):
    m = re.match(r"^([-+]?[0-9.]+(?:e[-+]?[0-9]+)?)(meg|[tgkmunpf])?", tok.lower())
    if not m:
        raise ValueError("not a number: %s" % tok)
    return float(m.group(1)) * SUFFIX.get(m.group(2) or "", 1.0)


class Meas:
    """What generate.ngspice_deck needs to know about a deck."""

    def __init__(self, entry, text):
        m = re.match(r"^\s*[0-9.]+\s*V.*/\s*([0-9.]+)\s*Hz\s*$", entry["mains"])
        self.freq = float(m.group(1))
        self.out = (entry["output"]["net"], entry["output"]["return"])
        self.tstop = None
        for line in text.splitlines():
            f = line.split()
            if f and f[0].lower() == ".tran" and len(f) >= 3:
                self.tstop = spice_number(f[2])
        if self.tstop is None:
            raise ValueError("%s has no .tran line" % entry["file"])


def absolute_includes(text, deck_dir):
    out = []
    for line in text.splitlines():
        f = line.split(None, 1)
        if f and f[0].lower() in (".include", ".inc") and len(f) == 2:
            name = f[1].strip().strip("\"'")
            line = '.include "%s"' % os.path.join(deck_dir, name)
        out.append(line)
    return "\n".join(out) + "\n"


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("decks", nargs="*", help="deck file names (default: every entry of expected.json)")
    ap.add_argument("--jobs", type=int, default=os.cpu_count() or 1)
    args = ap.parse_args()

    path = os.path.join(HERE, "expected.json")
    with open(path) as f:
        doc = json.load(f)
    entries = [e for e in doc["decks"] if not args.decks or e["file"] in args.decks]
    jobs = []
    for e in entries:
        deck = os.path.join(HERE, e["file"])
        with open(deck) as f:
            text = f.read()
        jobs.append((e["file"], generate.ngspice_deck(absolute_includes(text, os.path.dirname(deck)), Meas(e, text))))
    results = {}
    with ThreadPoolExecutor(max_workers=max(1, args.jobs)) as pool:
        for fname, vals in pool.map(generate.run_ngspice, jobs):
            results[fname] = vals
    failed = 0
    for e in entries:
        vals = results[e["file"]]
        if "error" in vals:
            failed += 1
            print("%s NGSPICE FAILED:\n%s" % (e["file"], vals["error"]), file=sys.stderr)
            continue
        e["ngspice"] = {"v_mean": generate.sig(vals["vmean"]), "v_ripple_pp": generate.sig(vals["vpp"])}
        got = vals["vpp"] if e["output"].get("ac") else vals["vmean"]
        flag = ""
        if abs(got - e["textbook"]) > 0.12 * abs(e["textbook"]) + 0.3:
            flag = "   <-- differs from the textbook value %.4g by more than 12 %%" % e["textbook"]
        print("%-36s mean %-10.5g pp %-10.5g (%s)%s" % (e["file"], vals["vmean"], vals["vpp"], vals["options"], flag))
    with open(path, "w") as f:
        json.dump(doc, f, indent=1, sort_keys=True)
        f.write("\n")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
