#!/usr/bin/env python3
"""
Writes the test workbooks with a real spreadsheet application: each is described here as a flat
OpenDocument spreadsheet (.fods) and converted to .xlsx by LibreOffice headless (Debian's libreoffice-calc),
which stores formula results and date systems as a spreadsheet application does. The .xlsx files are
committed and readback.R reads them with R's readxl; the tests also write them afresh into a temporary
folder (the optional argument) and check our reader finds the same cells there (CI installs LibreOffice).

    python3 test/sources/workbooks/make.py [FOLDER] && Rscript test/sources/workbooks/readback.R

The values are the 72 invented months of test/bad-input/good/data/values.csv.
"""
import os
import shutil
import subprocess
import sys
import tempfile
from datetime import date
from xml.sax.saxutils import escape

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.normpath(os.path.join(HERE, '..', '..', '..'))

with open(os.path.join(ROOT, 'test/bad-input/good/data/values.csv')) as f:
    MONTHS = [(l.split(',')[0], float(l.split(',')[1])) for l in f.read().strip().split('\n')[1:]]

HEAD = '''<?xml version="1.0" encoding="UTF-8"?>
<office:document xmlns:office="urn:oasis:names:tc:opendocument:xmlns:office:1.0"
 xmlns:table="urn:oasis:names:tc:opendocument:xmlns:table:1.0"
 xmlns:text="urn:oasis:names:tc:opendocument:xmlns:text:1.0"
 xmlns:number="urn:oasis:names:tc:opendocument:xmlns:datastyle:1.0"
 xmlns:style="urn:oasis:names:tc:opendocument:xmlns:style:1.0"
 xmlns:fo="urn:oasis:names:tc:opendocument:xmlns:xsl-fo-compatible:1.0"
 xmlns:of="urn:oasis:names:tc:opendocument:xmlns:of:1.2"
 office:version="1.2" office:mimetype="application/vnd.oasis.opendocument.spreadsheet">
 <office:automatic-styles>
  <number:date-style style:name="D1"><number:year number:style="long"/><number:text>-</number:text><number:month number:style="long"/><number:text>-</number:text><number:day number:style="long"/></number:date-style>
  <number:date-style style:name="D2"><number:year number:style="long"/><number:text>-</number:text><number:month number:style="long"/><number:text>-</number:text><number:day number:style="long"/><number:text> </number:text><number:hours number:style="long"/><number:text>:</number:text><number:minutes number:style="long"/></number:date-style>
  <style:style style:name="cd" style:family="table-cell" style:data-style-name="D1"/>
  <style:style style:name="ct" style:family="table-cell" style:data-style-name="D2"/>
  <style:style style:name="cb" style:family="table-cell"><style:table-cell-properties fo:background-color="#ffff00"/></style:style>
 </office:automatic-styles>
 <office:body><office:spreadsheet>
'''
TAIL = ' </office:spreadsheet></office:body>\n</office:document>\n'


def s(text):
    return f'<table:table-cell office:value-type="string"><text:p>{escape(text)}</text:p></table:table-cell>'


def n(value):
    return f'<table:table-cell office:value-type="float" office:value="{value!r}"><text:p>{value!r}</text:p></table:table-cell>'


def d(iso):
    return f'<table:table-cell table:style-name="cd" office:value-type="date" office:date-value="{iso}"><text:p>{iso}</text:p></table:table-cell>'


def dt(iso):
    return f'<table:table-cell table:style-name="ct" office:value-type="date" office:date-value="{iso}"><text:p>{iso}</text:p></table:table-cell>'


def f(formula, value):
    return f'<table:table-cell table:formula="of:={escape(formula)}" office:value-type="float" office:value="{value!r}"><text:p>{value!r}</text:p></table:table-cell>'


def empty(k=1):
    return '<table:table-cell/>' * k


def merged(text, span):
    return (f'<table:table-cell office:value-type="string" table:number-columns-spanned="{span}" table:number-rows-spanned="1"><text:p>{escape(text)}</text:p></table:table-cell>'
            + '<table:covered-table-cell/>' * (span - 1))


def row(*cells):
    return '<table:table-row>' + ''.join(cells) + '</table:table-row>\n'


def styled_empty_row(k):
    # A row that holds only formatting: what a spreadsheet keeps below the data after cells were cleared.
    return '<table:table-row>' + '<table:table-cell table:style-name="cb"/>' * k + '</table:table-row>\n'


def sheet(name, rows):
    return f'<table:table table:name="{escape(name)}">\n' + ''.join(rows) + '</table:table>\n'


def serial1900(iso):
    return (date.fromisoformat(iso) - date(1899, 12, 30)).days


def serial1904(iso):
    return (date.fromisoformat(iso) - date(1904, 1, 1)).days


def monthly_workbook():
    """Sheet 1 is notes; sheet 2 the data under a title, with a blank-headed formula column and trailing rows."""
    notes = [row(s('Sample deliveries, invented for the tests.')), row(s('The data are on the sheet "Monthly".'))]
    data = [row(s('Sample deliveries by month')), row(empty()), row(s('month'), s('zone'), s('amount'), empty(), s('note'))]
    for i, (m, v) in enumerate(MONTHS):
        r = 4 + i
        data.append(row(d(f'{m}-01'), s('North'), n(v), f(f'[.C{r}]*2', round(v * 2, 10)), s('') if i % 5 else s('checked')))
    data += [styled_empty_row(5) for _ in range(6)]
    return HEAD + sheet('Read me', notes) + sheet('Monthly', data) + TAIL


def serial_workbook(system):
    """Dates written as plain serial numbers (General format), in the workbook's own date system."""
    serial = serial1904 if system == 1904 else serial1900
    rows = [row(merged('Deliveries', 2), s('')), row(s('day serial'), s('amount'), s('month as text'))]
    for m, v in MONTHS:
        rows.append(row(n(serial(f'{m}-01')), n(v), s(m)))
    settings = '<table:calculation-settings><table:null-date table:date-value="1904-01-01"/></table:calculation-settings>\n' if system == 1904 else ''
    return HEAD + settings + sheet('Serials', rows) + TAIL


def hourly_workbook():
    """Date-times as formatted dates, 1904 system, two days of hours."""
    rows = [row(s('hour'), s('load'))]
    for h in range(48):
        day = 1 + h // 24
        rows.append(row(dt(f'2026-03-{day:02d}T{h % 24:02d}:00:00'), n(100 + h % 24 + (h // 24) * 0.5)))
    settings = '<table:calculation-settings><table:null-date table:date-value="1904-01-01"/></table:calculation-settings>\n'
    return HEAD + settings + sheet('Hours', rows) + TAIL


def convert(books, outdir):
    """All workbooks in one LibreOffice run (each start costs seconds); the .xlsx files land in outdir."""
    work = tempfile.mkdtemp(prefix='trendbrief-fods-')
    try:
        sources = []
        for name, fods in books.items():
            src = os.path.join(work, name + '.fods')
            with open(src, 'w') as fh:
                fh.write(fods)
            sources.append(src)
        profile = os.path.join(work, 'profile')
        subprocess.run(['soffice', f'-env:UserInstallation=file://{profile}', '--headless', '--calc',
                        '--convert-to', 'xlsx:Calc MS Excel 2007 XML', '--outdir', work, *sources],
                       check=True, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        for name in books:
            shutil.copyfile(os.path.join(work, name + '.xlsx'), os.path.join(outdir, name + '.xlsx'))
    finally:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == '__main__':
    # An optional folder argument writes the workbooks there instead (the tests write them afresh).
    out = sys.argv[1] if len(sys.argv) > 1 else HERE
    convert({
        'monthly': monthly_workbook(),
        'serial-1900': serial_workbook(1900),
        'serial-1904': serial_workbook(1904),
        'hourly-1904': hourly_workbook(),
    }, out)
    print('wrote', ', '.join(x for x in sorted(os.listdir(out)) if x.endswith('.xlsx')))
