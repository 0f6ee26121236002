#!/usr/bin/env python3
"""Re-evaluate the claim rows of peerpack figures files, independently of
the Go code that wrote them.

Usage: check_claims.py FIGURES.csv [FIGURES.csv ...]

Every row of section "commentary" whose measure is claim.NNN holds
"LEFT OP RIGHT": OP one of < <= = >= > != (spaces around it), each side a
number, a figure key written section/group/indicator/institution/year/
measure, or cites.NNN naming that sentence's own citation row. Each side is
looked up in the same file and the comparison evaluated with Python floats
(the file writes numbers in their shortest exact form, so float() reads
back the same binary value). Prints "checked N claims, F false" and one line
per false or unreadable claim; exits 1 if any.

Only the standard library's csv module is used (Debian's python3).
"""
import csv
import sys

OPS = {
    "<": lambda a, b: a < b,
    "<=": lambda a, b: a <= b,
    "=": lambda a, b: a == b,
    ">=": lambda a, b: a >= b,
    ">": lambda a, b: a > b,
    "!=": lambda a, b: a != b,
}


def check(path):
    numbers, texts = {}, {}
    claims = []
    with open(path, newline="", encoding="utf-8") as f:
        rows = csv.reader(f)
        header = next(rows)
        if header != ["section", "group", "indicator", "institution", "year", "measure", "value"]:
            raise SystemExit(f"{path}: unexpected header {header}")
        for row in rows:
            section, group, indicator, institution, year, measure, value = row
            key = "/".join(row[:6])
            if section == "commentary":
                sentence = (section, group, indicator, institution)
                texts[(sentence, measure)] = value
                if measure.startswith("claim."):
                    claims.append((sentence, measure, value))
                continue
            try:
                numbers[key] = float(value)
            except ValueError:
                texts[key] = value
    problems = []

    def operand(sentence, s):
        if s.startswith("cites."):
            cited = texts.get((sentence, s))
            if cited is None:
                raise LookupError(f"the sentence has no {s}")
            s = cited
        if s in numbers:
            return numbers[s]
        if "/" in s:
            raise LookupError(f"no numeric figure {s}")
        return float(s)

    for sentence, measure, text in claims:
        parsed = None
        # The operator is the token with a space on each side; keys may
        # hold spaces (group names) but the claim row puts exactly one
        # operator between single spaces, so try each and keep the split
        # whose sides both resolve.
        for op in sorted(OPS, key=len, reverse=True):
            token = f" {op} "
            start = 0
            while True:
                i = text.find(token, start)
                if i < 0:
                    break
                try:
                    parsed = (operand(sentence, text[:i]), op, operand(sentence, text[i + len(token):]))
                    break
                except (LookupError, ValueError):
                    start = i + 1
            if parsed:
                break
        where = f"{path}: {'/'.join(sentence)}/{measure}"
        if not parsed:
            problems.append(f"{where}: cannot read {text!r}")
            continue
        left, op, right = parsed
        if not OPS[op](left, right):
            problems.append(f"{where}: {text!r} is false ({left!r} {op} {right!r})")
    return len(claims), problems


def main(paths):
    total, problems = 0, []
    for p in paths:
        n, bad = check(p)
        total += n
        problems += bad
    for p in problems:
        print(p)
    print(f"checked {total} claims, {len(problems)} false")
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
