"""Peer of `brittle part` for `npm run bench`, timed as a whole process (start-up included):

    python3 bench/peer_part.py ELEMENTS.csv M

reads the element table (elem,s1,s2,s3,ivol) with pyarrow's CSV reader, the fastest CSV
reader an engineer with the scientific python stack has to hand (multi-threaded by default),
and computes the PIA effective size in numpy as bench/peers.py does for the in-memory row:
sum_e V_e sum_i (max(s_i, 0) / s_peak)^m. Prints {"effectiveSize", "peak", "rows"} as JSON.
"""

import json
import sys

import numpy as np
import pyarrow.csv


def main():
    path, m = sys.argv[1], float(sys.argv[2])
    table = pyarrow.csv.read_csv(path)
    # Column by column, as pyarrow hands them over: no copy into one n x 3 array.
    principal = [table.column(name).to_numpy() for name in ("s1", "s2", "s3")]
    sizes = table.column("ivol").to_numpy()
    peak = max(s.max() for s in principal)
    effective = float(np.dot(sizes, sum((np.clip(s, 0.0, None) / peak) ** m for s in principal)))
    json.dump({"effectiveSize": effective, "peak": float(peak), "rows": int(len(sizes))}, sys.stdout)


if __name__ == "__main__":
    main()
