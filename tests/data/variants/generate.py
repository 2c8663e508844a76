#!/usr/bin/env python3
"""Drawing-variant corpus for the block recognisers (issue 14).

Writes one SPICE deck per (topology, drawing variant, instance) into this folder and the
expectations into expected.json.  The decks were written from docs/blocks.md and
docs/annotations.md only, without reading the recogniser code, so they are an independent
test of how the recognisers cope with decks drawn by other people.

    python3 generate.py            # rewrite the decks, keep the stored ngspice values
    python3 generate.py --ngspice  # rewrite the decks and re-measure every output with ngspice

The reference values come from ngspice (`ngspice -b`): the generator derives a control deck
from each mainscheck deck (same elements, plus a behavioural source that forms
v(net) - v(return) and two .meas lines), runs a transient long enough to reach steady state
and measures the mean and the peak-to-peak value over the last whole mains periods.

Python standard library only.  Output is deterministic (fixed seed, sorted JSON).
"""

import argparse
import json
import math
import os
import random
import re
import subprocess
import sys
import tempfile
from concurrent.futures import ThreadPoolExecutor

HERE = os.path.dirname(os.path.abspath(__file__))
SEED = 20240614
INSTANCES = 2          # random instances (values, designators) per drawing variant

# Generic diode models.  The parameters are generic, written from memory in the style of
# published models; they are NOT vendor data.  Both mainscheck and ngspice read them.
MODELS = {
    "D1N4007": ".model D1N4007 D(IS=7n RS=0.04 N=1.9 BV=1000 IBV=5u CJO=15p)",
    "DGP10": ".model DGP10 D(IS=5n RS=0.03 N=1.8 BV=1000 IBV=5u CJO=10p)",
    "DBR2A": ".model DBR2A D(IS=10n RS=0.02 N=1.8 BV=600 IBV=10u CJO=40p)",
    "DZ12V": ".model DZ12V D(IS=1e-14 RS=5 N=1 BV=12 IBV=5m)",
    "DZ15V": ".model DZ15V D(IS=1e-14 RS=5 N=1 BV=15 IBV=5m)",
}
ZENER_V = {"DZ12V": 12.0, "DZ15V": 15.0}


# --------------------------------------------------------------------------------------------
# deck model
# --------------------------------------------------------------------------------------------

class Part:
    def __init__(self, ref, nodes, value, ann=None, tag=None, kind=None):
        self.ref = ref
        self.nodes = list(nodes)
        self.value = value          # text after the nodes (value or model name)
        self.ann = ann              # "*@part" attributes, text, or None
        self.tag = tag              # group tag for subcircuit wrapping
        self.kind = kind or ref[0].upper()


class Namer:
    """Reference designators: numbered (R1, C2), role names (R_SURGE, CRES) or a mix."""

    def __init__(self, rng, style):
        self.rng = rng
        self.style = style
        self.used = set()
        self.count = {}

    def _unique(self, name):
        base, n = name, 2
        while name.upper() in self.used:
            name = "%s%d" % (base, n) if not base[-1].isdigit() else "%s_%d" % (base, n)
            n += 1
        self.used.add(name.upper())
        return name

    def __call__(self, letter, *role_names):
        style = self.style
        if style == "mixed":
            style = self.rng.choice(["num", "role"])
        role_names = [r for r in role_names if len(r) > 1]
        if style == "role" and role_names:
            name = self.rng.choice(role_names)
            if len(name) <= 2 or name in ("D_BR", "D_CW", "C_RES", "C_PUMP", "C_SMOOTH", "DM", "CP", "CSM"):
                n = 1
                while (name + str(n)).upper() in self.used:
                    n += 1
                name = name + str(n)
            return self._unique(name)
        while True:
            self.count[letter] = self.count.get(letter, 0) + 1
            name = "%s%d" % (letter, self.count[letter])
            if name.upper() not in self.used:
                return self._unique(name)


class Deck:
    def __init__(self, topology, kind, title, vrms, freq):
        self.topology = topology
        self.kind = kind
        self.title = title
        self.comments = []
        self.vrms = vrms
        self.freq = freq
        self.parts = []
        self.models = set()
        self.line = "L"             # builder's hot net
        self.neutral = "N"          # builder's return net of the mains
        self.out = None             # (net, return)
        self.ac = False
        self.tstop = 0.5
        self.textbook = None        # rough hand value of the compared quantity, for the sanity check
        self.params = []            # (name, value)
        self.subckts = []           # text blocks
        self.gnd = None             # builder net to call node 0 when the mains floats
        self.mains_modes = ("n0", "line0", "float")

    def add(self, ref, nodes, value, ann=None, tag=None, model=None):
        if model:
            self.models.add(model)
        p = Part(ref, nodes, value, ann, tag)
        self.parts.append(p)
        return p

    def nets(self):
        s = set()
        for p in self.parts:
            s.update(p.nodes)
        return s

    def rename(self, mapping):
        for p in self.parts:
            p.nodes = [mapping.get(n, n) for n in p.nodes]
        self.line = mapping.get(self.line, self.line)
        self.neutral = mapping.get(self.neutral, self.neutral)
        self.out = tuple(mapping.get(n, n) for n in self.out)
        if self.gnd:
            self.gnd = mapping.get(self.gnd, self.gnd)


def fmt_si(x, cap=False):
    if cap and 1e-6 <= x < 1:
        return "%.3gu" % (x * 1e6)
    for suf, mult in (("meg", 1e6), ("k", 1e3), ("", 1.0), ("m", 1e-3), ("u", 1e-6), ("n", 1e-9), ("p", 1e-12)):
        if abs(x) >= mult * 0.999:
            v = x / mult
            s = ("%.3g" % v)
            return s + suf
    return "%g" % x


def vpk(vrms):
    return vrms * math.sqrt(2.0)


# --------------------------------------------------------------------------------------------
# topology builders.  They draw with abstract mains nets L (hot) and N (return); the mains
# mode applied afterwards decides which of them is node 0.
# --------------------------------------------------------------------------------------------

VF = 0.8  # rough diode drop for the textbook estimates


def surge_in(d, nm, o, net_from, net_to_name, value="10", neutral=False):
    """Series resistor(s) from net_from to a new net; returns the new net (or net_from)."""
    if not o.get("surge_n" if neutral else "surge"):
        return net_from
    new = net_to_name
    if o.get("split") and not neutral:
        mid = new + "M"
        half = {"10": "4.7", "22": "10", "47": "22", "100": "47"}.get(value, value)
        d.add(nm("R", "R_SURGE", "RS"), [net_from, mid], half, "p_rated=1 e_pulse=5")
        d.add(nm("R", "R_SURGE", "RS", "RLIM"), [mid, new], half, "p_rated=1 e_pulse=5")
    else:
        d.add(nm("R", "RN", "R_SURGE_N") if neutral else nm("R", "R_SURGE", "RS", "RLIM"),
              [net_from, new], value, "p_rated=2 e_pulse=10")
    return new


def reservoir(d, nm, o, a, b, c_uf, vrat, tag=None):
    """Reservoir capacitor a(+) to b, optionally as two parallel halves."""
    if o.get("split"):
        for _ in range(2):
            d.add(nm("C", "CRES", "C_RES", "CB"), [a, b], fmt_si(c_uf * 0.5e-6, True), "v_rated=%d" % vrat, tag)
    else:
        d.add(nm("C", "CRES", "C_RES", "CB"), [a, b], fmt_si(c_uf * 1e-6, True), "v_rated=%d" % vrat, tag)


def load(d, nm, o, a, b, r, prated, split_ok=False):
    if o.get("split") and split_ok:
        mid = "LD" + a
        d.add(nm("R", "RLOAD", "RL", "R_LOAD"), [a, mid], fmt_si(r / 2), "p_rated=%g" % prated)
        d.add(nm("R", "RLOAD", "RL", "R_LOAD"), [mid, b], fmt_si(r / 2), "p_rated=%g" % prated)
    else:
        d.add(nm("R", "RLOAD", "RL", "R_LOAD"), [a, b], fmt_si(r), "p_rated=%g" % prated)


def diode(d, nm, anode, cathode, model, o, roles=("D",), tag=None, ann="v_rated=1000 i_rated=1 i_surge=30"):
    if o.get("negative"):
        anode, cathode = cathode, anode
    return d.add(nm("D", *roles), [anode, cathode], model, ann, tag, model=model)


def pick_mains(rng, o):
    if o.get("mains120"):
        return 120.0, 60.0
    return 230.0, 50.0


def b_half_wave(rng, o, negative):
    o = dict(o, negative=negative)
    vrms, f = pick_mains(rng, o)
    d = Deck("half-wave-%s" % ("negative" if negative else "positive"), "half-wave-rectifier",
             "half-wave rectifier with reservoir", vrms, f)
    nm = o["namer"]
    c = rng.choice([10, 22, 47])
    r = rng.choice([47e3, 68e3, 100e3]) * (0.5 if vrms < 200 else 1)
    a = surge_in(d, nm, o, "L", "LS", "10")
    ret = surge_in(d, nm, o, "N", "NR", "10", neutral=True)
    diode(d, nm, a, "DC", "D1N4007", o, ("D", "D_RECT", "DR"), tag="stage")
    reservoir(d, nm, o, "DC", ret, c, 450, tag="stage")
    if o.get("bleeder"):
        d.add(nm("R", "RBLEED", "R_BL"), ["DC", ret], "1meg", "p_rated=0.5 v_rated=500")
    load(d, nm, o, "DC", ret, r, 5, split_ok=not o.get("surge"))
    d.out = ("DC", ret)
    v = vpk(vrms) - VF
    i = v / r
    d.textbook = (-1 if negative else 1) * (v - i / (f * c * 1e-6) / 2)
    d.tstop = 0.4
    return d


def bridge_core(d, nm, o, a, b, p, m, model="D1N4007", tag="stage"):
    roles = ("D", "DB", "D_BR")
    ann = "v_rated=600 i_rated=2 i_surge=50" if model == "DBR2A" else "v_rated=1000 i_rated=1 i_surge=30"
    diode(d, nm, a, p, model, o, roles, tag, ann)
    diode(d, nm, b, p, model, o, roles, tag, ann)
    diode(d, nm, m, a, model, o, roles, tag, ann)
    diode(d, nm, m, b, model, o, roles, tag, ann)


def b_bridge(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("bridge", "bridge-rectifier", "bridge rectifier from discrete diodes", vrms, f)
    nm = o["namer"]
    c = rng.choice([47, 68, 100])
    r = rng.choice([22e3, 33e3, 47e3]) * (0.5 if vrms < 200 else 1)
    a = surge_in(d, nm, o, "L", "ACA", "10")
    b = surge_in(d, nm, o, "N", "ACB", "10", neutral=True)
    bridge_core(d, nm, o, a, b, "VP", "VM")
    reservoir(d, nm, o, "VP", "VM", c, 450, tag="stage")
    if o.get("bleeder"):
        d.add(nm("R", "RBLEED", "R_BL"), ["VP", "VM"], "470k", "p_rated=0.5 v_rated=500")
    load(d, nm, o, "VP", "VM", r, 10, split_ok=True)
    d.out = ("VP", "VM")
    v = vpk(vrms) - 2 * VF
    d.textbook = (-1 if o.get("negative") else 1) * (v - v / r / (2 * f * c * 1e-6) / 2)
    d.mains_modes = ("n0", "float")
    d.gnd = "VM"
    d.tstop = 0.4
    return d


def transformer(d, nm, o, vsec, centre_tap, pri_a, pri_b, sec_nets):
    """Primary pri_a-pri_b, secondary across sec_nets (2 nets, or 3 with the tap in the middle)."""
    lp = 4.0
    k = 0.998
    d.comments.append("* Transformer: N2/N1 = sqrt(L2/L1) = %.4f, %g V r.m.s. %s from %g V."
                      % (vsec / d.vrms, vsec, "per half" if centre_tap else "secondary", d.vrms))
    ls = lp * (vsec / d.vrms) ** 2
    if o.get("winding_r"):
        d.comments.append("* Winding resistances drawn as separate resistors (RPRI, RSEC...).")
        d.add(nm("R", "RPRI", "R_PRI", "RWP"), [pri_a, "PW"], "12", "p_rated=5")
        pri_a = "PW"
    wind = [nm("L", "LP", "LPRI", "L_PRI")]
    d.add(wind[0], [pri_a, pri_b], fmt_si(lp))
    if o.get("winding_r"):
        ends = []
        for i, s in enumerate([sec_nets[0], sec_nets[-1]]):
            w = s + "W"
            d.add(nm("R", "RSEC", "R_SEC", "RWS"), [w, s], "0.15", "p_rated=2")
            ends.append(w)
        sec_nets = [ends[0]] + list(sec_nets[1:-1]) + [ends[1]]
    if centre_tap:
        w1 = nm("L", "LS", "LSEC", "L_SEC")
        w2 = nm("L", "LS", "LSEC", "L_SEC")
        d.add(w1, [sec_nets[0], sec_nets[1]], fmt_si(ls))
        d.add(w2, [sec_nets[1], sec_nets[2]], fmt_si(ls))
        wind += [w1, w2]
    else:
        w1 = nm("L", "LS", "LSEC", "L_SEC")
        d.add(w1, [sec_nets[0], sec_nets[1]], fmt_si(ls))
        wind.append(w1)
    d.comments.append("* ngspice couples inductors in pairs: one K line per pair of windings")
    for i in range(len(wind)):
        for j in range(i + 1, len(wind)):
            d.add(nm("K", "K%d%d" % (i + 1, j + 1), "K_%d%d" % (i + 1, j + 1)), [], "%s %s %g" % (wind[i], wind[j], k))


def b_centre_tap(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("centre-tap", "centre-tap-rectifier", "centre-tapped transformer, two-diode rectifier", vrms, f)
    nm = o["namer"]
    vsec = rng.choice([9.0, 12.0, 15.0])
    c = rng.choice([1000, 2200, 3300])
    r = rng.choice([33.0, 47.0, 68.0])
    transformer(d, nm, o, vsec, True, "L", "N", ["SA", "CT", "SB"])
    ann = "v_rated=100 i_rated=1 i_surge=30"
    diode(d, nm, "SA", "VOUT", "DGP10", o, ("D", "D_CT", "DR"), "stage", ann)
    diode(d, nm, "SB", "VOUT", "DGP10", o, ("D", "D_CT", "DR"), "stage", ann)
    reservoir(d, nm, o, "VOUT", "CT", c, 35, tag="stage")
    load(d, nm, o, "VOUT", "CT", r, 10, split_ok=True)
    d.out = ("VOUT", "CT")
    v = vpk(vsec) - VF - 0.3
    d.textbook = (-1 if o.get("negative") else 1) * (v - v / r / (2 * f * c * 1e-6) / 2)
    d.gnd = "CT"
    d.iso_ref = "CT"
    d.tstop = 0.6
    return d


def b_dual_rail(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("dual-rail", "dual-rail-rectifier", "symmetric rails from a centre-tapped secondary", vrms, f)
    nm = o["namer"]
    vsec = rng.choice([15.0, 18.0, 24.0])
    c = rng.choice([2200, 4700])
    r = rng.choice([47.0, 68.0, 100.0])
    transformer(d, nm, o, vsec, True, "L", "N", ["SA", "CT", "SB"])
    two_diode = o.get("two_diode")
    ann = "v_rated=100 i_rated=2 i_surge=50"
    pos, neg = "VP", "VN"
    if o.get("negative"):
        pos, neg = neg, pos  # diodes reversed: the rail called VN is now the positive one
    if two_diode:
        diode(d, nm, "SA", "VP", "DBR2A", o, ("D", "D_POS"), "stage", ann)
        diode(d, nm, "VN", "SB", "DBR2A", o, ("D", "D_NEG"), "stage", ann)
        half = True
    else:
        bridge_core(d, nm, o, "SA", "SB", "VP", "VN", "DBR2A")
        half = False
    reservoir(d, nm, o, pos, "CT", c, 50, tag="stage")
    reservoir(d, nm, o, "CT", neg, c, 50, tag="stage")
    load(d, nm, o, pos, "CT", r, 10, split_ok=True)
    load(d, nm, o, "CT", neg, r, 10)
    d.out = (pos, "CT")
    v = vpk(vsec) - VF - 0.3
    fr = f if half else 2 * f
    d.textbook = v - v / r / (fr * c * 1e-6) / 2
    d.gnd = "CT"
    d.iso_ref = "CT"
    d.tstop = 0.6
    return d


def b_xfmr_bridge(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("transformer-bridge", "bridge-rectifier", "isolation transformer, bridge rectifier on the secondary", vrms, f)
    nm = o["namer"]
    vsec = rng.choice([12.0, 18.0, 24.0])
    c = rng.choice([1000, 2200, 4700])
    r = rng.choice([47.0, 68.0, 100.0])
    transformer(d, nm, o, vsec, False, "L", "N", ["SA", "SB"])
    bridge_core(d, nm, o, "SA", "SB", "VP", "VM", "DBR2A")
    reservoir(d, nm, o, "VP", "VM", c, 50, tag="stage")
    load(d, nm, o, "VP", "VM", r, 10, split_ok=True)
    d.out = ("VP", "VM")
    v = vpk(vsec) - 2 * VF
    d.textbook = (-1 if o.get("negative") else 1) * (v - v / r / (2 * f * c * 1e-6) / 2)
    d.gnd = "VM"
    d.iso_ref = "VM"
    d.tstop = 0.6
    return d


def dropper_cap(d, nm, o, a, b, c_nf):
    """X2 series capacitor a-b (two halves in parallel when split) and its bleeder(s)."""
    if o.get("split"):
        for _ in range(2):
            d.add(nm("C", "CX", "C_DROP", "CS"), [a, b], fmt_si(c_nf * 0.5e-9), "class=X2 v_rated_ac=275", "drop")
        mid = "BLM"
        d.add(nm("R", "RB", "R_BLEED"), [a, mid], "470k", "p_rated=0.25 v_rated=250")
        d.add(nm("R", "RB", "R_BLEED"), [mid, b], "470k", "p_rated=0.25 v_rated=250")
    else:
        d.add(nm("C", "CX", "C_DROP", "CS"), [a, b], fmt_si(c_nf * 1e-9), "class=X2 v_rated_ac=275", "drop")
        d.add(nm("R", "RB", "R_BLEED"), [a, b], "1meg", "p_rated=0.25 v_rated=350")


def b_capdrop_bridge(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("capdrop-bridge", "capacitive-dropper", "capacitive dropper, bridge tail, zener-clamped", vrms, f)
    nm = o["namer"]
    cnf = rng.choice([330, 470, 680]) * (2 if vrms < 200 else 1)
    zm = rng.choice(["DZ12V", "DZ15V"])
    rl = rng.choice([1.5e3, 2.2e3, 3.3e3])
    a = "LS"
    d.add(nm("R", "R_SURGE", "RS", "RLIM"), ["L", "LS"], "100", "p_rated=1 e_pulse=10", "drop")
    b = surge_in(d, nm, o, "N", "ACB", "47", neutral=True)
    dropper_cap(d, nm, o, a, "ACA", cnf)
    bridge_core(d, nm, o, "ACA", b, "VP", "VM")
    pos, neg = ("VM", "VP") if o.get("negative") else ("VP", "VM")
    reservoir(d, nm, o, pos, neg, rng.choice([100, 220]), 35, tag="stage")
    d.add(nm("D", "DZ", "DZ"), [neg, pos], zm, "type=zener v_zener=%g p_rated=1.3" % ZENER_V[zm], "stage", model=zm)
    load(d, nm, o, "VP", "VM", rl, 0.5, split_ok=True)
    d.out = ("VP", "VM")
    d.textbook = (-1 if o.get("negative") else 1) * (ZENER_V[zm] + 0.05)
    d.mains_modes = ("n0", "float")
    d.gnd = "VM"
    d.tstop = 1.5
    return d


def b_capdrop_half(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("capdrop-halfwave-zener", "capacitive-dropper", "capacitive dropper, half-wave zener tail", vrms, f)
    nm = o["namer"]
    cnf = rng.choice([330, 470, 680]) * (2 if vrms < 200 else 1)
    zm = rng.choice(["DZ12V", "DZ15V"])
    rl = rng.choice([2.2e3, 3.3e3, 4.7e3])
    creservoir = rng.choice([100, 220, 470])
    return_diode = o.get("return_diode", rng.random() < 0.5)
    d.add(nm("R", "R_SURGE", "RS", "RLIM"), ["L", "LS"], "100", "p_rated=1 e_pulse=10", "drop")
    dropper_cap(d, nm, o, "LS", "A", cnf)
    ret = surge_in(d, nm, o, "N", "NR", "22", neutral=True)
    if return_diode:
        # return diode on the AC node, zener across the output
        diode(d, nm, ret, "A", "D1N4007", o, ("D", "D_RET", "DR"), "stage")
        diode(d, nm, "A", "VZ", "D1N4007", o, ("D", "D_RECT", "DS"), "stage")
        zn = [ret, "VZ"]
        vout = ZENER_V[zm] + 0.05
    else:
        # zener from the return into the AC node, series diode to the reservoir
        diode(d, nm, "A", "VZ", "D1N4007", o, ("D", "D_RECT", "DS"), "stage")
        zn = [ret, "A"]
        vout = ZENER_V[zm] - 0.65
    if o.get("negative"):
        zn = zn[::-1]
    d.add(nm("D", "DZ", "DZ"), zn, zm, "type=zener v_zener=%g p_rated=1.3" % ZENER_V[zm], "stage", model=zm)
    reservoir(d, nm, o, "VZ", ret, creservoir, 25, tag="stage")
    load(d, nm, o, "VZ", ret, rl, 0.5, split_ok=True)
    d.out = ("VZ", ret)
    d.textbook = (-1 if o.get("negative") else 1) * vout
    d.tstop = 1.5
    return d


def b_resdrop(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("resistive-dropper", "resistive-dropper", "resistive dropper, half-wave, zener-clamped rail", vrms, f)
    nm = o["namer"]
    rd = rng.choice([15e3, 22e3]) * (0.5 if vrms < 200 else 1)
    zm = rng.choice(["DZ12V", "DZ15V"])
    rl = rng.choice([10e3, 15e3])
    if o.get("split"):
        d.add(nm("R", "RD", "R_DROP"), ["L", "RDM"], fmt_si(rd / 2), "p_rated=2 v_rated=350", "drop")
        d.add(nm("R", "RD", "R_DROP"), ["RDM", "A"], fmt_si(rd / 2), "p_rated=2 v_rated=350", "drop")
    else:
        d.add(nm("R", "RD", "R_DROP"), ["L", "A"], fmt_si(rd), "p_rated=3 v_rated=500", "drop")
    ret = "N"
    diode(d, nm, "A", "VCC", "D1N4007", o, ("D", "D_RECT"), "stage")
    zn = [ret, "VCC"] if not o.get("negative") else ["VCC", ret]
    d.add(nm("D", "DZ", "DZ"), zn, zm, "type=zener v_zener=%g p_rated=1.3" % ZENER_V[zm], "stage", model=zm)
    reservoir(d, nm, o, "VCC", ret, rng.choice([47, 100]), 25, tag="stage")
    load(d, nm, o, "VCC", ret, rl, 0.25)
    d.out = ("VCC", ret)
    d.textbook = (-1 if o.get("negative") else 1) * (ZENER_V[zm] + 0.02)
    d.tstop = 2.0
    return d


def b_sym_doubler(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("symmetric-doubler", "voltage-doubler", "symmetric (full-wave) voltage doubler", vrms, f)
    nm = o["namer"]
    c = rng.choice([100, 220, 330])
    r = rng.choice([47e3, 68e3]) * (0.5 if vrms < 200 else 1)
    a = surge_in(d, nm, o, "L", "LN", "10")
    if o.get("surge_n"):
        mid = surge_in(d, nm, o, "N", "NM", "10", neutral=True)
    else:
        mid = "N"
    diode(d, nm, a, "P", "D1N4007", o, ("D", "D_UP", "DU"), "stage")
    diode(d, nm, "Q", a, "D1N4007", o, ("D", "D_DN", "DL"), "stage")
    reservoir(d, nm, o, "P", mid, c, 400, tag="stage")
    reservoir(d, nm, o, mid, "Q", c, 400, tag="stage")
    load(d, nm, o, "P", "Q", r, 10, split_ok=True)
    d.out = ("P", "Q")
    v = 2 * (vpk(vrms) - VF)
    d.textbook = (-1 if o.get("negative") else 1) * (v - (v / r) / (f * c * 1e-6 / 2) / 2)
    d.gnd = "Q"
    d.tstop = 1.0
    return d


def ladder(d, nm, o, in_net, ret, stages, cp, cs, tag_each=False):
    """Greinacher/Cockcroft-Walton ladder; returns the list of (a_k, b_k)."""
    nodes = []
    prev_a, prev_b = in_net, ret
    sign = "N" if o.get("negative") else ""
    for k in range(1, stages + 1):
        a, b = "A%d%s" % (k, sign), "B%d%s" % (k, sign)
        tag = "st%d" % k if tag_each else "stage"
        d.add(nm("C", "CP", "C_PUMP"), [prev_a, a], fmt_si(cp), "v_rated=%d" % (630 if k == 1 else 1000), tag)
        diode(d, nm, prev_b, a, "D1N4007", o, ("D", "DM", "D_CW"), tag)
        diode(d, nm, a, b, "D1N4007", o, ("D", "DM", "D_CW"), tag)
        d.add(nm("C", "CSM", "C_SMOOTH"), [b, prev_b], fmt_si(cs), "v_rated=1000", tag)
        nodes.append((a, b))
        prev_a, prev_b = a, b
    return nodes


def b_hw_doubler(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("half-wave-doubler", "half-wave-doubler", "half-wave (Greinacher) voltage doubler", vrms, f)
    nm = o["namer"]
    cp = rng.choice([2.2e-6, 4.7e-6])
    cs = rng.choice([2.2e-6, 4.7e-6])
    r = rng.choice([220e3, 330e3, 470e3])
    inn = surge_in(d, nm, o, "L", "LS", "100")
    ret = "N"
    if o.get("surge_n"):
        ret = surge_in(d, nm, o, "N", "NR", "47", neutral=True)
    nodes = ladder(d, nm, o, inn, ret, 1, cp, cs)
    b = nodes[-1][1]
    load(d, nm, o, b, ret, r, 3, split_ok=True)
    d.out = (b, ret)
    v = 2 * (vpk(vrms) - VF)
    i = v / r
    d.textbook = (-1 if o.get("negative") else 1) * (v - i / f * (1 / cp + 0.5 / cs))
    d.tstop = 1.5
    return d


def b_quadrupler(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("quadrupler", "voltage-quadrupler", "voltage quadrupler (positive and negative half-wave doublers)", vrms, f)
    nm = o["namer"]
    cp = rng.choice([1e-6, 2.2e-6])
    r = rng.choice([2.2e6, 3.3e6, 4.7e6])
    inn = surge_in(d, nm, o, "L", "LS", "100")
    ret = "N"
    if o.get("surge_n"):
        ret = surge_in(d, nm, o, "N", "NR", "47", neutral=True)
    pos = ladder(d, nm, dict(o, negative=False), inn, ret, 1, cp, cp)
    neg = ladder(d, nm, dict(o, negative=True), inn, ret, 1, cp, cp)
    bp, bn = pos[0][1], neg[0][1]
    load(d, nm, o, bp, bn, r, 2, split_ok=True)
    d.out = (bp, bn)
    v = 4 * (vpk(vrms) - VF)
    i = v / r
    d.textbook = v - 2 * i / f * (1 / cp + 0.5 / cp)
    d.tstop = 1.5
    return d


def b_cw3(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("cockcroft-walton-3", "cockcroft-walton", "three-stage Cockcroft-Walton multiplier", vrms, f)
    nm = o["namer"]
    c = rng.choice([47e-9, 100e-9])
    r = rng.choice([100e6, 220e6])
    inn = surge_in(d, nm, o, "L", "LS", "1k")
    ret = "N"
    if o.get("surge_n"):
        ret = surge_in(d, nm, o, "N", "NR", "470", neutral=True)
    nodes = ladder(d, nm, o, inn, ret, 3, c, c, tag_each=True)
    b = nodes[-1][1]
    load(d, nm, o, b, ret, r, 1, split_ok=True)
    d.out = (b, ret)
    n = 3
    v = 2 * n * (vpk(vrms) - VF)
    i = v / r
    d.textbook = (-1 if o.get("negative") else 1) * (v - i / (f * c) * (2 * n ** 3 / 3 + n ** 2 / 2 - n / 6))
    d.tstop = 2.5
    return d


def b_res_divider(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("resistive-divider", "resistive-divider", "mains sense resistive divider", vrms, f)
    nm = o["namer"]
    ru = rng.choice([940e3, 1e6, 2e6])
    rl = rng.choice([4.7e3, 10e3])
    if o.get("split"):
        d.add(nm("R", "RU", "R_UP", "R_TOP"), ["L", "S1"], fmt_si(ru / 2), "p_rated=0.25 v_rated=200 tol=1%")
        d.add(nm("R", "RU", "R_UP", "R_TOP"), ["S1", "SENSE"], fmt_si(ru / 2), "p_rated=0.25 v_rated=200 tol=1%")
    else:
        d.add(nm("R", "RU", "R_UP", "R_TOP"), ["L", "SENSE"], fmt_si(ru), "p_rated=0.5 v_rated=500 tol=1%")
    ret = "N"
    d.add(nm("R", "RLO", "R_LOW", "R_BOT"), ["SENSE", ret], fmt_si(rl), "p_rated=0.125 tol=1%")
    # the load: an RC filter into an ADC input (input resistance RADC)
    d.add(nm("R", "RAF", "R_FILT"), ["SENSE", "ADC"], "10k", "p_rated=0.063")
    d.add(nm("C", "CF", "C_FILT"), ["ADC", ret], "10n", "v_rated=16")
    d.add(nm("R", "RADC", "R_IN"), ["ADC", ret], "1meg", "p_rated=0.063 role=load")
    d.out = ("SENSE", ret)
    d.ac = True
    rlo = 1 / (1 / rl + 1 / (10e3 + 1e6))
    d.textbook = 2 * vpk(vrms) * rlo / (ru + rlo)
    d.tstop = 0.2
    return d


def b_cap_divider(rng, o):
    vrms, f = pick_mains(rng, o)
    d = Deck("capacitive-divider", "capacitive-divider", "capacitive divider (mains presence probe)", vrms, f)
    nm = o["namer"]
    cu = rng.choice([1e-9, 2.2e-9])
    cl = rng.choice([100e-9, 220e-9])
    if o.get("split"):
        d.add(nm("C", "CY", "C_UP", "C_TOP"), ["L", "TAP"], fmt_si(cu / 2), "class=Y2 v_rated_ac=300")
        d.add(nm("C", "CY", "C_UP", "C_TOP"), ["L", "TAP"], fmt_si(cu / 2), "class=Y2 v_rated_ac=300")
    else:
        d.add(nm("C", "CY", "C_UP", "C_TOP"), ["L", "TAP"], fmt_si(cu), "class=Y2 v_rated_ac=300")
    ret = "N"
    d.add(nm("C", "CLO", "C_LOW", "C_BOT"), ["TAP", ret], fmt_si(cl), "v_rated=50")
    load(d, nm, o, "TAP", ret, 1e6, 0.125)
    d.out = ("TAP", ret)
    d.ac = True
    zl = 1 / complex(1 / 1e6, 2 * math.pi * f * cl)
    zu = 1 / complex(0, 2 * math.pi * f * cu)
    d.textbook = 2 * vpk(vrms) * abs(zl / (zl + zu))
    d.tstop = 0.2
    return d


# --------------------------------------------------------------------------------------------
# drawing variants
# --------------------------------------------------------------------------------------------

# Each variant: name -> options.  Keys: mains (n0 / line0 / float), surge, surge_n, split,
# shuffle, subckt, autonames, params, negative, winding_r, mains120, refres (10 MEG reference).
COMMON_VARIANTS = [
    ("plain", {}),
    ("surge-line", {"surge": True}),
    ("surge-both", {"surge": True, "surge_n": True}),
    ("mains-floating-ref", {"mains": "float"}),
    ("line-referenced", {"mains": "line0"}),
    ("shuffled-pins-swapped", {"shuffle": True, "surge": True}),
    ("subckt-stage", {"subckt": True}),
    ("autonamed-params", {"autonames": True, "params": True}),
    ("split-parts", {"split": True, "surge": True}),
    ("mains-120v-60hz", {"mains120": True, "shuffle": True}),
]

POLARITY = [("negative", {"negative": True}), ("negative-shuffled", {"negative": True, "shuffle": True, "surge": True})]

TRANSFORMER_VARIANTS = [
    ("plain", {}),
    ("winding-resistances", {"winding_r": True}),
    ("secondary-ref-10meg", {"mains": "n0"}),
    ("primary-line-referenced", {"mains": "line0"}),
    ("shuffled-pins-swapped", {"shuffle": True}),
    ("subckt-stage", {"subckt": True}),
    ("autonamed-params", {"autonames": True, "params": True}),
    ("split-parts", {"split": True}),
    ("mains-120v-60hz", {"mains120": True, "winding_r": True}),
    ("negative", {"negative": True}),
    ("winding-r-shuffled-subckt", {"winding_r": True, "shuffle": True, "subckt": True}),
]


def variants_for(topology):
    if topology in ("centre-tap", "transformer-bridge"):
        return TRANSFORMER_VARIANTS
    if topology == "dual-rail":
        v = [(n, o) for n, o in TRANSFORMER_VARIANTS]
        v += [("two-diode-" + n, dict(o, two_diode=True)) for n, o in TRANSFORMER_VARIANTS[:6]]
        return v
    if topology in ("half-wave-positive", "half-wave-negative"):
        return COMMON_VARIANTS + [("bleeder", {"bleeder": True, "mains": "float"})]
    if topology == "bridge":
        return ([(n, o) for n, o in COMMON_VARIANTS if n != "line-referenced"]
                + [("dc-side-ref-10meg", {"refres": True, "surge": True}), ("bleeder-floating", {"bleeder": True, "mains": "float"})]
                + POLARITY)
    if topology == "capdrop-bridge":
        return ([(n, o) for n, o in COMMON_VARIANTS if n != "line-referenced"]
                + [("dc-side-ref-10meg", {"refres": True})] + POLARITY)
    if topology == "capdrop-halfwave-zener":
        return (COMMON_VARIANTS + POLARITY
                + [("return-diode", {"return_diode": True}), ("zener-on-ac-node", {"return_diode": False, "shuffle": True})])
    if topology in ("resistive-divider", "capacitive-divider"):
        return [(n, o) for n, o in COMMON_VARIANTS if n not in ("surge-line", "surge-both", "split-parts", "shuffled-pins-swapped")] + [
            ("shuffled-pins-swapped", {"shuffle": True}), ("split-parts", {"split": True}),
            ("split-shuffled", {"split": True, "shuffle": True, "mains": "float"})]
    if topology == "resistive-dropper":
        return [(n, o) for n, o in COMMON_VARIANTS if n not in ("surge-line", "surge-both")] + POLARITY + [
            ("split-shuffled", {"split": True, "shuffle": True})]
    # multipliers
    return COMMON_VARIANTS + POLARITY


BUILDERS = {
    "half-wave-positive": lambda rng, o: b_half_wave(rng, o, False),
    "half-wave-negative": lambda rng, o: b_half_wave(rng, o, True),
    "bridge": b_bridge,
    "centre-tap": b_centre_tap,
    "dual-rail": b_dual_rail,
    "capdrop-bridge": b_capdrop_bridge,
    "capdrop-halfwave-zener": b_capdrop_half,
    "resistive-dropper": b_resdrop,
    "symmetric-doubler": b_sym_doubler,
    "half-wave-doubler": b_hw_doubler,
    "quadrupler": b_quadrupler,
    "cockcroft-walton-3": b_cw3,
    "transformer-bridge": b_xfmr_bridge,
    "resistive-divider": b_res_divider,
    "capacitive-divider": b_cap_divider,
}


def apply_mains(d, mode, o, rng):
    """Decide which net is node 0, add the mains source and any simulator reference."""
    extra = []
    if mode not in d.mains_modes:
        mode = "float" if "float" in d.mains_modes else d.mains_modes[0]
    has_iso = hasattr(d, "iso_ref")
    if has_iso:
        # transformer decks: primary neutral = 0 and the secondary referenced through 10 MEG,
        # or (mode float) the primary floats and the secondary's reference net is node 0.
        if mode == "float":
            d.rename({d.gnd: "0"})
            extra.append(("RNREF", ["N", "0"], "10meg", "* the primary floats; 10 MEG simulator reference"))
        elif mode == "line0":
            d.rename({"L": "0"})
            extra.append(("RREF", [d.iso_ref, "0"], "10meg",
                          "* isolated secondary: 10 MEG simulator reference to node 0"))
        else:
            d.rename({"N": "0"})
            extra.append(("RREF", [d.iso_ref, "0"], "10meg",
                          "* isolated secondary: 10 MEG simulator reference to node 0"))
        line, neutral = {"float": ("L", "N"), "line0": ("0", "N"), "n0": ("L", "0")}[mode]
        src = [line, neutral]
    elif mode == "n0":
        d.rename({"N": "0"})
        line, neutral = "L", "0"
        src = [line, neutral]
        if o.get("refres") and d.gnd:
            extra.append(("RREF", [d.gnd, "0"], "10meg", "* floating DC side: 10 MEG simulator reference"))
    elif mode == "line0":
        # circuit common is the line: the builder's hot net is the neutral
        d.rename({"L": "NEU", "N": "0"})
        d.rename({"NEU": "N"})
        line, neutral = "0", "N"
        src = [line, neutral]
    else:  # float
        if d.gnd:
            d.rename({d.gnd: "0"})
        line, neutral = "L", "N"
        src = [line, neutral]
        if not d.gnd or o.get("refres") or o.get("bleeder"):
            extra.append(("RREF", ["N", "0"], "10meg", "* floating mains: 10 MEG simulator reference"))
    d.mains_mode = mode
    d.supply = (line, neutral)
    return src, extra


def shuffle_parts(d, rng):
    ks = [p for p in d.parts if p.kind == "K"]
    others = [p for p in d.parts if p.kind != "K"]
    rng.shuffle(others)
    for p in others:
        if p.kind in "RC" and rng.random() < 0.5:
            p.nodes.reverse()
    d.parts = others + ks


def autoname(d, src):
    mapping = {}
    order = list(src)
    for p in d.parts:
        order += p.nodes
    for n in order:
        if n != "0" and n not in mapping:
            mapping[n] = "N%03d" % (len(mapping) + 1)
    d.rename(mapping)
    return [mapping.get(n, n) for n in src]


def parametrise(d, rng):
    names = set()
    for p in d.parts:
        if p.kind in "RC" and re.match(r"^[0-9.]+[a-z]*$", p.value) and rng.random() < 0.7:
            base = "%s_%s" % ("RVAL" if p.kind == "R" else "CVAL", re.sub(r"[^A-Z0-9]", "", p.ref.upper()))
            name = base
            while name in names:
                name += "X"
            names.add(name)
            d.params.append((name, p.value))
            p.value = "{%s}" % name


def wrap_subckt(d, rng, src):
    """Move every part tagged 'stage' (or each 'stN') into subcircuits instantiated with X."""
    groups = {}
    for p in d.parts:
        if p.tag and (p.tag == "stage" or p.tag.startswith("st")) and p.kind != "K":
            groups.setdefault(p.tag, []).append(p)
    if not groups:
        return
    # a repeated ladder stage becomes one subcircuit definition instantiated per stage
    keep = [p for p in d.parts if p not in sum(groups.values(), [])]
    outside_nets = set(src) | set(d.out)
    for p in keep:
        outside_nets.update(p.nodes)
    new_parts = list(keep)
    defined = {}
    for gi, (tag, members) in enumerate(sorted(groups.items())):
        nets = []
        for p in members:
            for n in p.nodes:
                if n not in nets:
                    nets.append(n)
        others_nets = set(outside_nets)
        for tag2, m2 in groups.items():
            if tag2 != tag:
                for p in m2:
                    others_nets.update(p.nodes)
        ports = [n for n in nets if n != "0" and n in others_nets]
        # signature: element kinds + connection pattern + values + annotations, ports generic
        local = {}
        for i, n in enumerate(ports):
            local[n] = "P%d" % (i + 1) if tag != "stage" else n
        k = 0
        for n in nets:
            if n not in local and n != "0":
                k += 1
                local[n] = "INT%d" % k
        body = []
        seen_refs = {}
        for j, p in enumerate(members):
            lref = p.ref if tag == "stage" else "%s%d" % (p.ref[0], j + 1)
            if p.ann:
                body.append("*@part %s %s" % (lref, p.ann))
            body.append("%s %s %s" % (lref, " ".join(local.get(n, n) for n in p.nodes), p.value))
        sig = "\n".join(body)
        if sig in defined:
            name = defined[sig]
        else:
            name = ("RECT_STAGE" if tag == "stage" else "CW_STAGE%d" % (len(defined) + 1))
            if tag != "stage" and not defined:
                name = "CW_STAGE"
            defined[sig] = name
            d.subckts.append(".subckt %s %s\n%s\n.ends %s" % (name, " ".join(local[n] for n in ports), sig, name))
        inst = Part("X%s%d" % ("RECT" if tag == "stage" else "ST", gi + 1), ports, name)
        inst.kind = "X"
        new_parts.append(inst)
    d.parts = new_parts


def build_deck(topology, vname, opts, instance, seed):
    rng = random.Random(seed)
    o = dict(opts)
    style = rng.choice(["num", "role", "mixed"])
    o["namer"] = Namer(rng, style)
    d = BUILDERS[topology](rng, o)
    default = "float" if hasattr(d, "iso_ref") else "n0"
    src, extra = apply_mains(d, o.get("mains", default), o, rng)
    for ref, nodes, val, comment in extra:
        p = d.add(o["namer"]("R", ref), nodes, val)
        p.comment = comment
    if o.get("shuffle"):
        shuffle_parts(d, rng)
    if o.get("subckt"):
        wrap_subckt(d, rng, src)
    if o.get("autonames"):
        src = autoname(d, src)
        d.supply = tuple(src)
    if o.get("params"):
        parametrise(d, rng)
    d.src = src
    d.variant = vname
    d.instance = instance
    return d


def deck_text(d, fname):
    vp = vpk(d.vrms)
    L = []
    L.append("Variant corpus %s: %s (%s, instance %s)" % (d.topology, d.title, d.variant, d.instance))
    L.append("* Generated by tests/data/variants/generate.py - invented test circuit, do not edit by hand.")
    L.append("* Expected block: %s, output %s against %s." % (d.kind, d.out[0], d.out[1]))
    L += d.comments
    L.append("*@supply line=%s neutral=%s mains=%gV/%gHz" % (d.supply[0], d.supply[1], d.vrms, d.freq))
    L.append("VMAINS %s %s SIN(0 %.2f %g)" % (d.src[0], d.src[1], vp, d.freq))
    for name, val in d.params:
        L.append(".param %s=%s" % (name, val))
    for p in d.parts:
        if getattr(p, "comment", None):
            L.append(p.comment)
        if p.ann:
            L.append("*@part %s %s" % (p.ref, p.ann))
        if p.kind == "K":
            L.append("%s %s" % (p.ref, p.value))
        else:
            L.append("%s %s %s" % (p.ref, " ".join(p.nodes), p.value))
    L += d.subckts
    L.append("* Diode models: generic parameters from memory, not vendor data.")
    for m in sorted(d.models):
        L.append(MODELS[m])
    L.append(".tran 20u %g" % d.tstop)
    L.append(".end")
    return "\n".join(L) + "\n"


def period(d):
    return 1.0 / d.freq


def ngspice_deck(text, d):
    """The control deck for ngspice: the same circuit, annotations dropped, plus measurements."""
    out = []
    for line in text.splitlines():
        s = line.strip()
        if s.startswith("*@"):
            continue
        if s.lower().startswith(".tran") or s.lower() == ".end":
            continue
        out.append(line)
    T = period(d)
    nper = 3
    t2 = round(d.tstop / T) * T
    t1 = t2 - nper * T
    net, ret = d.out
    out.append("BXMEAS xmeas_diff 0 V=V(%s)-V(%s)" % (net, ret))
    out.append("@@OPTIONS@@")
    out.append(".tran 20u %.6g 0 20u" % t2)
    out.append(".meas tran vmean AVG v(xmeas_diff) from=%.6g to=%.6g" % (t1, t2))
    out.append(".meas tran vpp PP v(xmeas_diff) from=%.6g to=%.6g" % (t1, t2))
    out.append(".end")
    return "\n".join(out) + "\n"


# Gear integration first: decks whose mains floats on a 10 MEG reference stop with "timestep
# too small" under the default trapezoidal rule.  The fallbacks are tried in order.
# A 10 G shunt from every node to ground (rshunt) keeps the floating decks well conditioned; it is
# three decades above the decks' own 10 MEG references and changes no measured value.
# (reltol=1e-4 with Gear stalls on those decks; the default reltol is ample for a 3 % check.)
NGSPICE_OPTIONS = [".options method=gear rshunt=1e10", ".options method=gear rshunt=1e10 cshunt=1p",
                   ".options rshunt=1e10", ".options method=gear", ".options reltol=1e-4"]


def run_ngspice(job):
    fname, text = job
    tail = ""
    for opts in NGSPICE_OPTIONS:
        with tempfile.TemporaryDirectory() as tmp:
            path = os.path.join(tmp, "deck.cir")
            with open(path, "w") as f:
                f.write(text.replace("@@OPTIONS@@", opts))
            try:
                r = subprocess.run(["ngspice", "-b", path], capture_output=True, text=True, timeout=120)
            except subprocess.TimeoutExpired:
                tail = "timeout with %s" % opts
                continue
        vals = {}
        for line in (r.stdout + r.stderr).splitlines():
            m = re.match(r"^\s*(vmean|vpp)\s*=\s*([-+0-9.eE]+)", line)
            if m:
                vals[m.group(1)] = float(m.group(2))
        if "vmean" in vals and "vpp" in vals:
            vals["options"] = opts
            return fname, vals
        tail = "\n".join((r.stdout + r.stderr).splitlines()[-6:])
    return fname, {"error": tail}


def sig(x, n=5):
    return float("%.*g" % (n, x))


def all_decks():
    topologies = list(BUILDERS)
    decks = []
    for ti, topo in enumerate(topologies):
        for vi, (vname, opts) in enumerate(variants_for(topo)):
            for inst in range(INSTANCES):
                seed = SEED + 10007 * ti + 101 * vi + inst
                d = build_deck(topo, vname, opts, "ab"[inst], seed)
                fname = "%s__%s__%s.cir" % (topo, vname, "ab"[inst])
                decks.append((fname, d))
    return decks


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--ngspice", action="store_true", help="re-measure every deck with ngspice")
    ap.add_argument("--only-missing", action="store_true",
                    help="with --ngspice: measure only the decks that have no stored values")
    ap.add_argument("--jobs", type=int, default=os.cpu_count() or 1)
    args = ap.parse_args()

    exp_path = os.path.join(HERE, "expected.json")
    stored = {}
    if os.path.exists(exp_path):
        with open(exp_path) as f:
            for e in json.load(f)["decks"]:
                stored[e["file"]] = e

    decks = all_decks()
    for old in os.listdir(HERE):
        if old.endswith(".cir"):
            os.remove(os.path.join(HERE, old))
    texts = {}
    for fname, d in decks:
        t = deck_text(d, fname)
        texts[fname] = t
        with open(os.path.join(HERE, fname), "w") as f:
            f.write(t)

    measured = {}
    if args.ngspice:
        jobs = [(fname, ngspice_deck(texts[fname], d)) for fname, d in decks
                if not (args.only_missing and "ngspice" in stored.get(fname, {}))]
        with ThreadPoolExecutor(max_workers=args.jobs) as pool:
            for i, (fname, vals) in enumerate(pool.map(run_ngspice, jobs)):
                if "error" in vals:
                    print("[%d/%d] %s NGSPICE FAILED:\n%s" % (i + 1, len(jobs), fname, vals["error"]), file=sys.stderr)
                    continue
                measured[fname] = vals
                print("[%d/%d] %s mean %.4g pp %.4g" % (i + 1, len(jobs), fname, vals["vmean"], vals["vpp"]),
                      file=sys.stderr)

    entries = []
    missing = []
    insane = []
    for fname, d in decks:
        e = {
            "file": fname,
            "topology": d.topology,
            "variant": d.variant + "/" + d.instance,
            "kind": d.kind,
            "output": {"net": d.out[0], "return": d.out[1], "ac": d.ac},
            "mains": "%gV/%gHz" % (d.vrms, d.freq),
            "textbook": sig(d.textbook, 4),
        }
        if fname in measured:
            e["ngspice"] = {"v_mean": sig(measured[fname]["vmean"]), "v_ripple_pp": sig(measured[fname]["vpp"])}
        elif fname in stored and "ngspice" in stored[fname]:
            e["ngspice"] = stored[fname]["ngspice"]
        else:
            missing.append(fname)
        if "ngspice" in e:
            got = e["ngspice"]["v_ripple_pp"] if d.ac else e["ngspice"]["v_mean"]
            if abs(got - d.textbook) > 0.12 * abs(d.textbook) + 0.3:
                insane.append("%s: ngspice %.4g, textbook %.4g" % (fname, got, d.textbook))
        entries.append(e)
    doc = {
        "comment": "Generated by generate.py; ngspice values from `generate.py --ngspice`. v_mean is the "
                   "mean of v(net) - v(return) over the last 3 mains periods, v_ripple_pp its max - min.",
        "decks": entries,
    }
    with open(exp_path, "w") as f:
        json.dump(doc, f, indent=1, sort_keys=True)
        f.write("\n")
    counts = {}
    for _, d in decks:
        counts[d.topology] = counts.get(d.topology, 0) + 1
    for k, v in counts.items():
        print("%-26s %d decks" % (k, v))
    print("total %d decks" % len(decks))
    if missing:
        print("warning: %d decks have no ngspice values; run generate.py --ngspice" % len(missing), file=sys.stderr)
    if insane:
        print("sanity: ngspice differs from the textbook value by more than 12 %:", file=sys.stderr)
        for s in insane:
            print("  " + s, file=sys.stderr)
    return 0


if __name__ == "__main__":
    sys.exit(main())
