# Regenerates values.xlsx with openpyxl 3.0.9 (Debian python3-openpyxl):
# a date in the numeric value column, cell D3. Run: /usr/bin/python3 generate.py
import datetime
import openpyxl

wb = openpyxl.Workbook()
ws = wb.active
ws.title = "Values"
for r in [["institution", "year", "indicator", "value"],
          ["KE001", 2024, "papers", 450],
          ["KE002", 2024, "papers", datetime.datetime(2024, 3, 31)],
          ["KE001", 2024, "intl_students", 14.5]]:
    ws.append(r)
ws["D3"].number_format = "yyyy-mm-dd"
wb.save("values.xlsx")
