#!/usr/bin/env python3
"""Check that a C program and a Lua script give identical results.

Usage: compare.py NAME LUA_DIR C_DIR
LUA_DIR holds doc.json, the --json document of `equipoise run NAME.lua`, and
the files the script wrote; C_DIR holds record.jsonl (the results and curves
the C program's observer reported), out.txt (what it printed) and the files
it wrote. Results and curves must be equal number for number (the same
doubles: both sides print them with cJSON, which writes a double with as
many digits as it takes to read back the same one); the printed lines equal;
every file the same bytes. Lines a script prints while iterating a Lua hash
table (pairs) come in an order Lua does not fix: a run of such lines is
compared as a set.
"""
import json
import os
import sys


def unordered_runs(lines, prefix="    note: "):
    out, run = [], []
    for line in lines + [None]:
        if line is not None and line.startswith(prefix):
            run.append(line)
            continue
        out.extend(sorted(run))
        run = []
        if line is not None:
            out.append(line)
    return out


def main():
    name, lua_dir, c_dir = sys.argv[1:4]
    doc = json.load(open(os.path.join(lua_dir, "doc.json"), encoding="utf-8"))
    fails = []
    if doc["status"] != "ok":
        fails.append("the Lua run failed: %s" % doc["error"])
    results, curves = [], []
    for line in open(os.path.join(c_dir, "record.jsonl"), encoding="utf-8"):
        rec = json.loads(line)
        (results if "result" in rec else curves).append(rec.get("result", rec.get("curve")))
    for kind, lua, c in (("results", doc["results"], results), ("curves", doc["curves"], curves)):
        lua = [{k: v for k, v in item.items() if k != "where"} for item in lua]
        if len(lua) != len(c):
            fails.append("%s: %d from Lua, %d from C" % (kind, len(lua), len(c)))
        for i, (a, b) in enumerate(zip(lua, c)):
            if a != b:
                keys = sorted(k for k in set(a) | set(b) if a.get(k) != b.get(k))
                fails.append("%s[%d] differ in %s" % (kind, i, ", ".join(keys)))
    text = open(os.path.join(c_dir, "out.txt"), encoding="utf-8").read()
    c_lines = text.split("\n")
    if c_lines and c_lines[-1] == "":
        c_lines.pop()
    lua_lines = unordered_runs(doc["output"])
    c_lines = unordered_runs(c_lines)
    if lua_lines != c_lines:
        for i, (a, b) in enumerate(zip(lua_lines + [""] * 9, c_lines + [""] * 9)):
            if a != b:
                fails.append("output line %d: Lua %r, C %r" % (i + 1, a, b))
                break
    skip = {"doc.json", "record.jsonl", "out.txt"}
    files = sorted(set(os.listdir(lua_dir)) | set(os.listdir(c_dir)) - skip)
    for f in files:
        if f in skip:
            continue
        pa, pb = os.path.join(lua_dir, f), os.path.join(c_dir, f)
        if not (os.path.exists(pa) and os.path.exists(pb)):
            fails.append("%s written by one side only" % f)
        elif open(pa, "rb").read() != open(pb, "rb").read():
            fails.append("%s differs" % f)
    if fails:
        for f in fails:
            print("FAIL %s: %s" % (name, f))
        return 1
    print("ok   %s: %d results, %d curves, %d lines, %d files identical"
          % (name, len(results), len(curves), len(c_lines), len(files) - len(skip & set(files))))
    return 0


if __name__ == "__main__":
    sys.exit(main())
