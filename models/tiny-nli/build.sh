#!/usr/bin/env bash
# Rebuilds the tiny SentencePiece NLI test models in this folder (see build.py). Not part of CI: the
# outputs are committed so the C# tests need no Python.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
apt-get install -y -q sentencepiece python3-sentencepiece python3-torch python3-onnx >/dev/null
cd "$here"
OMP_NUM_THREADS=1 /usr/bin/python3 build.py
