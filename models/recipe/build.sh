#!/usr/bin/env bash
# Rebuilds the shipped NLI model (models/nli-minilm-int8) from the pretrained MiniLM weights.
#   models/recipe/build.sh NLI_DATA_DIR [EPOCHS] [CHECKPOINT]
# NLI_DATA_DIR holds the open NLI files listed in models/nli-minilm-int8/MODEL_CARD.md (mnli/, snli/,
# cad_snli/, breaking_nli/, and extra/ with its own SOURCES.md). TREES (optional, environment) is a tree
# recording whose link health is printed per checkpoint: evaluation only, never trained on.
# CHECKPOINT names the checkpoint to ship (default epoch1.pt; the card says which one was chosen and why).
# Not part of CI: about an hour per epoch on one core of a 2-core machine.
set -euo pipefail
data=$(realpath "${1:?usage: build.sh NLI_DATA_DIR [EPOCHS] [CHECKPOINT]}")
epochs=${2:-1}
checkpoint=${3:-epoch1.pt}
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
    --out "$work/run" --epochs "$epochs" --seed 13 --threads 1 --checkpoints 4
/usr/bin/python3 -W ignore export.py --checkpoint "$work/run/$checkpoint" --base "$work/base" --work "$work/run" --out "$out" \
    --quantization rows --calibration "$work/run/calibration-pairs.jsonl" \
    --calibration-sample "$here/../../tests/Plumbline.Nli.Tests/data/nli/mnli-matched-dev-500.csv"
/usr/bin/python3 evalsets.py --data "$data" --extra "$data/extra" --out "$here/../../tests/Plumbline.Nli.Tests/data/nli" \
    --full "$here/../nli-eval" --work "$work"
