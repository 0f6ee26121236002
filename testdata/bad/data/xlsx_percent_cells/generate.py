# Regenerates values.xlsx with openpyxl 3.0.9 (Debian python3-openpyxl):
# intl_students (unit percent) entered as fractions formatted as
# percentages, as a spreadsheet stores 3.6 %. Run: /usr/bin/python3 generate.py
import openpyxl

wb = openpyxl.Workbook()
ws = wb.active
ws.title = "Values"
for r in [["institution", "year", "indicator", "value"],
          ["KE001", 2024, "papers", 450],
          ["KE002", 2024, "papers", 320],
          ["KE001", 2024, "intl_students", 0.036],
          ["KE002", 2024, "intl_students", 0.145]]:
    ws.append(r)
ws["D4"].number_format = "0.0%"
ws["D5"].number_format = "0.0%"
wb.save("values.xlsx")
