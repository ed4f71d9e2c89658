#!/usr/bin/env bash
# Rebuilds the shipped NLI model (models/nli-minilm-int8) from the pretrained MiniLM weights.
#   models/recipe/build.sh NLI_DATA_DIR [CHECKPOINT]
# NLI_DATA_DIR holds the open NLI files listed in models/nli-minilm-int8/MODEL_CARD.md (mnli/, snli/,
# cad_snli/, breaking_nli/, and extra/ with its own SOURCES.md). TREES (optional, environment) is a tree
# recording whose link health is printed per checkpoint: evaluation only, never trained on.
# Two runs: 1 epoch from the pretrained encoder without the sibling pairs, then a second 1-epoch schedule
# (peak learning rate 2e-5) that continues from the first with them. CHECKPOINT names the second run's
# checkpoint to ship (default step3036.pt, after 3/4 of its epoch; the card says why).
# Not part of CI: about an hour per run on one core of a 2-core machine.
set -euo pipefail
data=$(realpath "${1:?usage: build.sh NLI_DATA_DIR [CHECKPOINT]}")
checkpoint=${2:-step3036.pt}
here=$(cd "$(dirname "$0")" && pwd)
work="$here/../work"
out="$here/../nli-minilm-int8"

apt-get install -y -q python3-torch python3-onnx libopenblas0-openmp wordnet >/dev/null
# Debian's OpenBLAS does not recognise every recent Xeon and falls back to a slow generic kernel;
# SkylakeX kernels are correct on AVX-512 machines and several times faster (checked against fp64).
if grep -q avx512f /proc/cpuinfo; then export OPENBLAS_CORETYPE=SkylakeX; fi
# One thread: on two shared cores two OpenMP threads were slower than one.
export OMP_NUM_THREADS=1

dotnet run --project "$here/extract-base" -- "$work/base"
cd "$here"
trees=()
if [[ -n "${TREES:-}" ]]; then trees=(--trees "$TREES"); fi
/usr/bin/python3 -W ignore train.py --data "$data" --extra "$data/extra" "${trees[@]}" --base "$work/base" \
    --out "$work/run" --epochs 1 --seed 13 --threads 1 --checkpoints 4 --drop sibling
# The fp32 graph of the first run's end (written to $work/run), which the second run starts from.
/usr/bin/python3 -W ignore export.py --checkpoint "$work/run/epoch1.pt" --base "$work/base" --work "$work/run" --out "$work/run/int8"
/usr/bin/python3 -W ignore train.py --data "$data" --extra "$data/extra" "${trees[@]}" --base "$work/base" \
    --out "$work/run2" --epochs 1 --lr 2e-5 --seed 13 --threads 1 --checkpoints 4 --init "$work/run/model-fp32.onnx"
/usr/bin/python3 -W ignore export.py --checkpoint "$work/run2/$checkpoint" --base "$work/base" --work "$work/run2" --out "$out" \
    --quantization rows --calibration "$work/run2/calibration-pairs.jsonl" \
    --calibration-sample "$here/../../tests/Plumbline.Nli.Tests/data/nli/mnli-matched-dev-500.csv"
/usr/bin/python3 evalsets.py --data "$data" --extra "$data/extra" --out "$here/../../tests/Plumbline.Nli.Tests/data/nli" \
    --full "$here/../nli-eval" --work "$work"
