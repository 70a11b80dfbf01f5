#!/usr/bin/env bash
# Remakes the mutated copies of the demo report tr3-black (run from the repository root
# after `go generate ./samples`), one fault each; see README.md here.
set -euo pipefail
M=testdata/mutated
for c in swapped-digit psig-slip dropped-stage wrong-bofb cce-outlier; do
  rm -rf "$M/$c"; cp -r samples/data/tr3-black "$M/$c"
done
sed -i "s/^794,143,/794,243,/" $M/swapped-digit/dl.csv
sed -i 's/^saturation pressure,3054,psia/saturation pressure,3054,psig/' $M/psig-slip/fluid.csv
sed -i '/^14.7,0,/d' $M/dropped-stage/dl.csv
sed -i 's/^S2,stock tank,14.7,60,112,1.27,1.3533,30.5/S2,stock tank,14.7,60,112,1.27,1.4533,30.5/' $M/wrong-bofb/separator.csv
sed -i 's/^2321,1.1338,2.3603/2321,1.1638,2.3603/' $M/cce-outlier/cce.csv
# Each copy must differ from the demo in exactly one line.
for c in swapped-digit psig-slip dropped-stage wrong-bofb cce-outlier; do
  n=$(diff -r samples/data/tr3-black "$M/$c" | grep -c '^[<>]' || true)
  [ "$n" -ge 1 ] || { echo "make.sh: $c: the mutation did not apply" >&2; exit 1; }
done
