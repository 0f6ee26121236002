#!/usr/bin/python3
# Writes the workbooks that TestXLSXFormatsOpenpyxl reads, with openpyxl
# (Debian's python3-openpyxl), as a spreadsheet library other than the one
# the reader uses. Run from this folder: python3 generate.py
import datetime
import openpyxl
from openpyxl.utils.datetime import CALENDAR_MAC_1904


def write(name, epoch=None):
    wb = openpyxl.Workbook()
    if epoch is not None:
        wb.epoch = epoch
    ws = wb.active
    ws.title = "Data"
    ws.append(["id", "share", "when", "calc", "plain"])
    ws.append(["a", 0.036, datetime.datetime(2024, 3, 31), "=B2*100", 0.5])
    ws.append(["b", 0.125, datetime.datetime(1999, 12, 31, 18, 0), "=SUM(B2:B3)", 7])
    ws["B2"].number_format = "0.0%"
    ws["B3"].number_format = "0%"
    ws["C2"].number_format = "yyyy-mm-dd"
    ws["C3"].number_format = "d mmm yyyy h:mm"
    # openpyxl stores formulas without a computed result.
    wb.save(name)


write("formats_1900.xlsx")
write("formats_1904.xlsx", CALENDAR_MAC_1904)

wb = openpyxl.Workbook()
ws = wb.active
ws.title = "Data"
ws.append(["id", "calc"])
ws.append(["a", "=NOSUCHFUNCTION(1)"])
wb.save("formula_unknown.xlsx")
