# Regenerates values.xlsx with openpyxl 3.0.9 (Debian python3-openpyxl):
# cell D3 holds a formula, saved without a result as openpyxl does, that
# names a function no calculation engine knows. Run: /usr/bin/python3 generate.py
import openpyxl

wb = openpyxl.Workbook()
ws = wb.active
ws.title = "Values"
for r in [["institution", "year", "indicator", "value"],
          ["KE001", 2024, "papers", 450],
          ["KE002", 2024, "papers", "=NOSUCHFUNCTION(D2)"],
          ["KE001", 2024, "intl_students", 14.5]]:
    ws.append(r)
wb.save("values.xlsx")
