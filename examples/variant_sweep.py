#!/usr/bin/env python3
"""How the demos fare when a designer changes one thing: each demo layout built with
`segmask check` under variants of its rules, pad pitch, seal, transfer dots and drive,
one change at a time, two at once on the two cores. Prints one line per variant that is
neither clean nor refused as bad input (exit 2, a located message), then the counts per
variant.

A refusal is a fair answer (the layout cannot be made as it stands and the message says
where); an `unroutable` or other error after routing is the router's failure, or a
check's finding the layout could not have avoided.

Needs PyYAML (`pip install pyyaml`): the variants edit keys, not text.

Usage: python3 examples/variant_sweep.py target/release/segmask [DEMO.yaml ...]
       (no demos given: every file in demo-layouts/)
"""
import collections
import copy
import glob
import os
import subprocess
import sys
import tempfile
from concurrent.futures import ThreadPoolExecutor

import yaml


def rules(**kv):
    def edit(d):
        d.setdefault("rules", {})
        d["rules"].update(kv)
        if "min_width" in kv or "undercut" in kv:
            d["rules"].pop("lead_width", None)
    return edit


def pitch(p):
    def edit(d):
        d["pads"]["pitch"] = p
        d["pads"]["width"] = round(0.6 * p, 3)
        d["pads"].pop("start", None)
    return edit


def seal_width(w):
    def edit(d):
        d.setdefault("seal", {})["width"] = w
    return edit


def dots(diameter, pad):
    def edit(d):
        d["transfer_dots"] = {"diameter": diameter, "pad": pad}
    return edit


def duty(n):
    """Multiplexed at 1/n with the digits' gaps left to their default (the default gap
    is meant to route at every duty)."""
    def edit(d):
        d["drive"] = {"duty": f"1/{n}", "bias": "1/2" if n == 2 else "1/3"}
        for g in d.get("digits") or []:
            g.pop("gap", None)
    return edit


VARIANTS = {
    "rules-0.12-0.1": rules(min_width=0.12, min_gap=0.1, undercut="8um"),
    "rules-laser": rules(min_width=0.15, min_gap=0.15, undercut="10um"),
    "lead-0.2": rules(lead_width=0.2),
    "compensate": rules(compensate=True),
    "overlap-0.25": rules(backplane_overlap=0.25),
    "pitch-0.8": pitch(0.8),
    "pitch-2.0": pitch(2.0),
    "seal-1.5": seal_width(1.5),
    "dots-1.6": dots(1.0, 1.6),
    "duty-1/2": duty(2),
    "duty-1/3": duty(3),
    "duty-1/4": duty(4),
}


def current_duty(d):
    drive = d.get("drive") or "static"
    return drive if isinstance(drive, str) else str(drive.get("duty", "static"))


def run(job):
    binary, demo, name, doc = job
    fd, path = tempfile.mkstemp(suffix=".yaml")
    os.write(fd, yaml.safe_dump(doc, sort_keys=False).encode())
    os.close(fd)
    r = subprocess.run([binary, "check", path], capture_output=True, text=True)
    os.unlink(path)
    out = r.stdout + r.stderr
    if r.returncode == 2 and ": error in `" in out:
        return demo, name, "refused", []
    errors = [l.split("error[", 1)[1].split("]", 1)[0] for l in out.splitlines() if "error[" in l]
    warnings = [l.split("warning[", 1)[1].split("]", 1)[0] for l in out.splitlines() if "warning[" in l]
    if r.returncode == 0 and not errors and not warnings:
        return demo, name, "clean", []
    kinds = sorted(set(errors)) + sorted(set(w + " (warning)" for w in warnings))
    return demo, name, f"{len(errors)} errors, {len(warnings)} warnings", kinds


def main():
    binary = sys.argv[1]
    demos = sys.argv[2:] or sorted(glob.glob("demo-layouts/*.yaml"))
    jobs = []
    for path in demos:
        base = yaml.safe_load(open(path))
        for name, edit in VARIANTS.items():
            if name.startswith("duty-") and current_duty(base) == name[5:]:
                continue
            doc = copy.deepcopy(base)
            edit(doc)
            jobs.append((binary, os.path.basename(path)[:-5], name, doc))
    counts = collections.defaultdict(collections.Counter)
    with ThreadPoolExecutor(2) as ex:
        for demo, name, result, kinds in ex.map(run, jobs):
            short = result if result in ("clean", "refused") else "failed"
            counts[name][short] += 1
            if short == "failed":
                print(f"{demo:22s} {name:16s} {result}: {', '.join(kinds)}", flush=True)
    print()
    print("| variant | clean | refused | failed |")
    print("|---|---:|---:|---:|")
    for name in VARIANTS:
        c = counts[name]
        print(f"| {name} | {c['clean']} | {c['refused']} | {c['failed']} |")


if __name__ == "__main__":
    main()
