"""Peer of `brittle calc` on the many-fits sheet for `npm run bench`, timed as a whole process:

    python3 bench/peer_rows.py STRENGTHS.csv COLUMNS

reads the sheet bench/datasets.ts writes (a header line, then one specimen set per line in
the first COLUMNS columns, followed by two formula cells it ignores) with numpy, fits every
line with the same numpy Newton solve as the in-process peer (bench/peers.py), and prints
[[modulus, characteristic strength], ...] as JSON, one pair per line of the sheet.
"""

import json
import sys

import numpy as np

from peers import ml_numpy_newton


def main():
    path, columns = sys.argv[1], int(sys.argv[2])
    strengths = np.loadtxt(path, delimiter=",", skiprows=1, usecols=range(columns), quotechar='"', ndmin=2)
    json.dump([ml_numpy_newton(row) for row in strengths], sys.stdout)


if __name__ == "__main__":
    main()
