# Regenerates values.xlsx with openpyxl 3.0.9 (Debian python3-openpyxl):
# a decimal comma in cell D4. Run: /usr/bin/python3 generate.py
import openpyxl

wb = openpyxl.Workbook()
ws = wb.active
ws.title = "Values"
for r in [["institution", "year", "indicator", "value"],
          ["KE001", 2024, "papers", 450],
          ["KE002", 2024, "papers", 320],
          ["KE001", 2024, "intl_students", "14,5"]]:
    ws.append(r)
wb.save("values.xlsx")
