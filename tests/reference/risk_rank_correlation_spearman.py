"""Independent reference for the rank correlations of `stackwake risk --keep-samples`.

Shares no code with stackwake. Reads a risk_samples.csv (one row per sample and mode; the
sampled inputs repeat on each of a sample's rows), keeps one row per sample and prints
scipy.stats.spearmanr of the given key pairs, with repr so the Rust test can quote them.
Run: python3 tests/reference/risk_rank_correlation_spearman.py OUT/risk_samples.csv \
         KEY_A KEY_B [KEY_C KEY_D ...]
The numbers quoted in tests/cli_risk_rank_correlation.rs come from the case and settings
written there (demo case + its [[uncertain]] / [[rank_correlation]] tables, --samples 4000
--seed 17).
"""
import csv
import sys

from scipy.stats import spearmanr


def main():
    path, keys = sys.argv[1], sys.argv[2:]
    cols = {}
    seen = set()
    with open(path, newline="") as f:
        for row in csv.DictReader(f):
            if row["sample"] in seen:
                continue
            seen.add(row["sample"])
            for k in dict.fromkeys(keys):
                cols.setdefault(k, []).append(float(row[k]))
    print("samples", len(seen))
    for a, b in zip(keys[0::2], keys[1::2]):
        rho = spearmanr(cols[a], cols[b]).statistic
        print(a, b, repr(float(rho)))


if __name__ == "__main__":
    main()
