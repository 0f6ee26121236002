#!/usr/bin/env python3
"""Writes the size-limit cases of the malformed-input catalogue.

Cases in testdata/bad/data/ go over a default limit (they are large by
design); cases named limit_* go over a limit lowered with
--limit in their args.txt. Each case is the small base case (three
institutions, four indicators) with one thing changed. Run from the
repository root: python3 testdata/bad/data/limit_generate.py
"""
import os

BRIEF = """---
title: Malformed input case
focus: KE001
year: 2024
years: [2023, 2024]
data:
  register: institutions.csv
  values: {values}
  dictionary: indicators.yaml
---

# Case
"""

DICT = """indicators:
  - key: papers
    label: Papers published
    unit: count
    better: higher
    decimals: 0
  - key: intl_students
    label: International students
    unit: percent
    better: higher
    decimals: 1
  - key: female_share
    label: Share of female staff
    unit: share
    better: neutral
    decimals: 2
  - key: academic_staff
    label: Academic staff
    unit: count
    better: neutral
    decimals: 0
"""

REGISTER = """id,name,country,region,staff_fte
KE001,University of Kestria North,Kestria,North,1200
KE002,Kestria Technical Institute,Kestria,South,800
VA001,Valdora State University,Valdora,East,450
"""

VALUES = """institution,year,indicator,value
KE001,2023,papers,410
KE001,2024,papers,450
KE002,2024,papers,320
VA001,2024,papers,530
KE001,2024,intl_students,14.5
KE002,2024,intl_students,9.25
KE001,2024,academic_staff,1100
KE002,2024,academic_staff,700
"""


def case(root, name, values=VALUES, args=None, register=REGISTER, dictionary=DICT, values_name="values.csv", extra=None, front=""):
    d = os.path.join(root, name)
    os.makedirs(d, exist_ok=True)
    files = {"brief.md": BRIEF.format(values=values_name).replace("---\n\n#", front + "---\n\n#"), "indicators.yaml": dictionary,
             "institutions.csv": register, values_name: values}
    if args:
        files["args.txt"] = args + "\n"
    files.update(extra or {})
    for f, body in files.items():
        with open(os.path.join(d, f), "w", encoding="utf-8", newline="") as fh:
            fh.write(body)


def with_notes(values):
    """The long values with an empty note column added."""
    head, *rows = values.rstrip("\n").split("\n")
    return head + ",note\n" + "".join(r + ",\n" for r in rows)


BAD = os.path.join("testdata", "bad", "data")
LIM = os.path.join("testdata", "bad", "data")

# Over the default limits (64 KiB a field, 4,096 columns, 100 years).
case(BAD, "note_too_long", with_notes(VALUES) + 'VA001,2024,intl_students,12.5,"' + "see the annex. " * 4400 + '"\n')
case(BAD, "header_too_wide", "institution,year," + ",".join("c%d" % i for i in range(1, 4100)) + "\nKE001,2024" + ",1" * 4099 + "\n")
case(BAD, "too_many_years", "institution,year,indicator,value\n" + "".join("KE001,%d,papers,%d\n" % (y, 400 + y % 7) for y in range(1900, 2001)))

# A population threshold that is not a number (YAML's .nan and .inf decode
# as floats, and a NaN threshold would exclude no one).
case(BAD, "population_nan_threshold", front="population:\n  min_total:\n    - {indicator: papers, years: 2, at_least: .nan}\n")

# Over limits lowered with --limit.
long_rows = VALUES + "VA001,2023,papers,510\nVA001,2024,academic_staff,380\n"
case(LIM, "limit_rows", long_rows, "--limit rows=8")
case(LIM, "limit_rows_at_limit_valid", VALUES, "--limit rows=8")
case(LIM, "limit_institutions", VALUES, "--limit institutions=2")
case(LIM, "limit_indicators", VALUES, "--limit indicators=3")
assert len(REGISTER) < 200 < len(long_rows)
case(LIM, "limit_file_bytes", long_rows, "--limit file=200")
case(LIM, "limit_cell", with_notes(VALUES).replace("KE001,2024,papers,450,", "KE001,2024,papers,450,provisional figure from the annual return"), "--limit cell=32")
case(LIM, "limit_columns", "institution,year,papers,intl_students,academic_staff,female_share\nKE001,2024,450,14.5,1100,0.41\n", "--limit columns=5")
case(LIM, "limit_values", VALUES, "--limit values=20")
case(LIM, "limit_years", VALUES, "--limit years=1")
case(LIM, "limit_yaml_bytes", VALUES, "--limit yaml=200")
# A workbook sheet of 9 rows x 4 columns is held whole: 36 cells.
with open(os.path.join(BAD, "xlsx_unknown_sheet", "values.xlsx"), "rb") as fh:
    book = fh.read()
case(LIM, "limit_sheet_cells", values_name="values.xlsx#Values", args="--limit sheet-cells=20", extra={})
with open(os.path.join(LIM, "limit_sheet_cells", "values.xlsx"), "wb") as fh:
    fh.write(book)
os.remove(os.path.join(LIM, "limit_sheet_cells", "values.xlsx#Values"))

case(LIM, "limit_two_limits_valid", VALUES, "--limit rows=8,institutions=3 --limit=years=2")
