#!/usr/bin/env python3
"""Line-length convention: C# lines hold at most 150 characters.

Files that predate the convention may keep the long lines they had, counted per file in .ci/line-length-allowance.txt;
that count can only go down (shorten a line, then lower the number, or run with --update to rewrite the file from the
current tree). New files get no allowance. Run from the repository root: python3 .ci/check-line-length.py [--update]
"""
import subprocess, sys

LIMIT = 150
ALLOWANCE = ".ci/line-length-allowance.txt"


def long_lines():
    files = subprocess.run(["git", "ls-files", "*.cs"], capture_output=True, text=True, check=True).stdout.split()
    counts = {}
    for f in files:
        with open(f, encoding="utf-8") as h:
            n = sum(1 for line in h if len(line.rstrip("\n")) > LIMIT)
        if n:
            counts[f] = n
    return counts


def main():
    counts = long_lines()
    if "--update" in sys.argv:
        with open(ALLOWANCE, "w", encoding="utf-8") as h:
            h.write(f"# lines over {LIMIT} characters allowed per file (only ever lowered); see .ci/check-line-length.py\n")
            for f in sorted(counts):
                h.write(f"{counts[f]} {f}\n")
        print(f"{ALLOWANCE}: {sum(counts.values())} lines in {len(counts)} files")
        return 0
    allowed = {}
    with open(ALLOWANCE, encoding="utf-8") as h:
        for line in h:
            if line.strip() and not line.startswith("#"):
                n, f = line.split(maxsplit=1)
                allowed[f.strip()] = int(n)
    bad = [(f, n, allowed.get(f, 0)) for f, n in sorted(counts.items()) if n > allowed.get(f, 0)]
    for f, n, a in bad:
        print(f"{f}: {n} lines over {LIMIT} characters (allowed {a}); wrap the new ones")
    return 1 if bad else 0


if __name__ == "__main__":
    sys.exit(main())
