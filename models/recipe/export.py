"""Export a trained checkpoint: fp32 ONNX (opset 14), the int8 model, the model card file, the vocabulary,
and reference data for the C# parity tests (token ids and logits).

  python3 export.py --checkpoint WORK/final.pt --base BASE_DIR --work WORK --out ../nli-minilm-int8
"""
import argparse
import hashlib
import json
import os
import shutil

import torch

from bert import PairClassifier
from calibrate import expected_calibration_error, fit_temperature, gold_of, logits_of
from emulate import emulate_int8
from quantize import quantize
from wordpiece import WordPiece

MAX_LEN = 128
QUANTIZATION = {
    "weights": "int8 weights (uint8, per output column, dequantised before fp32 MatMul); uint8 word embeddings per row; fp32 activations",
    "rows": "int8 integer MatMuls (QuantizeLinear per token row, MatMulIntegerToFloat): symmetric 7-bit int8 weights per output column; uint8 activations quantised per token row (absmax/127 around 128), so a pair's scores do not depend on its batch; uint8 word embeddings per row",
}
LABELS = ["entailment", "neutral", "contradiction"]

# Invented sentences for the parity checks: accents, punctuation, numbers, casing, long inputs.
TOKENIZER_PAIRS = [
    ("A man is playing a guitar.", "Someone is making music."),
    ("The café on Rue Saint-Honoré opens at 7:30.", "The cafe opens before eight."),
    ("Naïve résumé écrit à Zürich", "NAÏVE RÉSUMÉ"),
    ("It's 3.14159 -- roughly π!", "Pi is about 3.14, isn't it?"),
    ("Dogs (and cats) aren't allowed; birds are.", "Pets: none allowed."),
    ("The U.S.A. has 50 states.", "There are fifty states in the USA."),
    ("", "An empty premise still gets scored."),
    ("An empty hypothesis follows.", ""),
    ("\"Quoted\" text, with commas, semicolons; and colons: here.", "Quotes ' and ` and ´ marks."),
    ("She paid $1,250.99 for 3 tickets on 2024-05-17.", "The tickets cost over a thousand dollars."),
    ("Mr. O'Neill's self-driving car drove 60 mph.", "A car drove itself."),
    ("ÀÉÎÕÜ àéîõü ñ ç ß ø å æ", "aeiou aeiou n c ss o a ae"),
    ("Tab\tseparated\twords and  double  spaces.", "Words separated by tabs."),
    ("unbelievably antidisestablishmentarianism", "hyperparameterization"),
    ("The year 1999 was followed by 2000.", "2000 came after 1999."),
    ("Emoji 🙂 and symbols © ® ™ appear.", "Symbols appear."),
    ("日本語のテキスト and English mixed.", "Mixed languages."),
    ("Hello!!! What??? Yes...", "Excited greeting."),
    ("A dog runs.", "A dog runs."),
    ("A dog runs.", "It is not true that a dog runs."),
    ("Two red cars are parked.", "Three blue cars are parked."),
    ("e-mail, co-operate, re-enter", "email cooperate reenter"),
    ("x" * 150, "A word longer than one hundred characters becomes unknown."),
    (" ".join(["The committee reviewed the long report carefully"] * 20), "The committee read a report."),
    ("Short premise.", " ".join(["and the hypothesis goes on and on"] * 25)),
    (" ".join(["alpha beta gamma delta"] * 30), " ".join(["epsilon zeta eta theta"] * 30)),
    ("Numbers: 0 1 2 3 4 5 6 7 8 9 10 100 1000 1,000,000", "Large numbers."),
    ("CamelCaseWords and snake_case_words", "Identifiers."),
    ("Ünïcödé Ñormalization Tëst", "unicode normalization test"),
    ("The end.", "The end?"),
]


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--checkpoint", required=True)
    ap.add_argument("--base", required=True)
    ap.add_argument("--work", required=True)
    ap.add_argument("--out", required=True)
    ap.add_argument("--quantization", choices=["weights", "rows"], default="rows")
    ap.add_argument("--calibration", help="held-out labelled pairs (JSON Lines) to fit the temperature on")
    ap.add_argument("--calibration-sample", help="a CSV of labelled pairs whose calibration error the C# tests recompute")
    args = ap.parse_args()
    torch.set_num_threads(2)
    os.makedirs(args.out, exist_ok=True)
    os.makedirs(os.path.join(args.out, "reference"), exist_ok=True)
    os.makedirs(args.work, exist_ok=True)

    model = PairClassifier()
    model.load_state_dict(torch.load(args.checkpoint))
    model.eval()
    tokenizer = WordPiece(os.path.join(args.base, "vocab.txt"))

    fp32_path = os.path.join(args.work, "model-fp32.onnx")
    ids = torch.tensor([[101, 1037, 3899, 102, 1037, 3899, 102]])
    torch.onnx.export(
        model, (ids, torch.ones_like(ids), torch.zeros_like(ids)), fp32_path, opset_version=14,
        input_names=["input_ids", "attention_mask", "token_type_ids"], output_names=["logits"],
        dynamic_axes={n: {0: "batch", 1: "sequence"} for n in ("input_ids", "attention_mask", "token_type_ids")}
        | {"logits": {0: "batch"}})
    int8_path = os.path.join(args.out, "model.onnx")
    quantize(fp32_path, int8_path, "word.weight", mode=args.quantization)
    shutil.copy(os.path.join(args.base, "vocab.txt"), os.path.join(args.out, "vocab.txt"))

    card = {
        "name": "plumbline-nli-minilm-l6-int8",
        "architecture": "bert",
        "tokenizer": "wordpiece",
        "vocabulary": "vocab.txt",
        "lower_case": True,
        "max_length": MAX_LEN,
        "labels": LABELS,
        "inputs": ["input_ids", "attention_mask", "token_type_ids"],
        "output": "logits",
        "quantization": QUANTIZATION[args.quantization],
    }
    emulated = emulate_int8(model, weights_only=args.quantization == "weights", rows=args.quantization == "rows")
    calibration = None
    if args.calibration:
        with open(args.calibration, encoding="utf-8") as f:
            held = [(r["premise"], r["hypothesis"], r["label"]) for r in map(json.loads, f)]
        held_logits, held_gold = logits_of(emulated, tokenizer, held, MAX_LEN), gold_of(held)
        temperature = fit_temperature(held_logits, held_gold)
        card["temperature"] = round(temperature, 4)
        calibration = {"temperature": card["temperature"], "fitted_on_pairs": len(held),
                       "held_out_ece_before": expected_calibration_error(held_logits, held_gold),
                       "held_out_ece_after": expected_calibration_error(held_logits, held_gold, card["temperature"])}
        if args.calibration_sample:
            import csv
            with open(args.calibration_sample, encoding="utf-8", newline="") as f:
                sample = [(r["sentence1"], r["sentence2"], r["label"]) for r in csv.DictReader(f)]
            sample_logits, sample_gold = logits_of(emulated, tokenizer, sample, MAX_LEN), gold_of(sample)
            calibration |= {"sample_file": os.path.basename(args.calibration_sample), "sample_pairs": len(sample),
                            "sample_ece_before": expected_calibration_error(sample_logits, sample_gold),
                            "sample_ece_after": expected_calibration_error(sample_logits, sample_gold, card["temperature"])}
        with open(os.path.join(args.out, "reference", "calibration.json"), "w", encoding="utf-8") as f:
            json.dump(calibration, f, indent=2)
            f.write("\n")
    with open(os.path.join(args.out, "nli-model.json"), "w", encoding="utf-8") as f:
        json.dump(card, f, indent=2)
        f.write("\n")

    with open(os.path.join(args.out, "reference", "token-ids.jsonl"), "w", encoding="utf-8") as f:
        for a, b in TOKENIZER_PAIRS:
            pair_ids, types = tokenizer.encode_pair(a, b, MAX_LEN)
            f.write(json.dumps({"premise": a, "hypothesis": b, "input_ids": pair_ids, "token_type_ids": types},
                               ensure_ascii=False) + "\n")

    with torch.no_grad(), open(os.path.join(args.out, "reference", "logits.jsonl"), "w", encoding="utf-8") as f:
        for a, b in TOKENIZER_PAIRS[:20]:
            pair_ids, types = tokenizer.encode_pair(a, b, MAX_LEN)
            t_ids = torch.tensor([pair_ids])
            t_types = torch.tensor([types])
            mask = torch.ones_like(t_ids)
            fp32 = model(t_ids, mask, t_types)[0].tolist()
            int8 = emulated(t_ids, mask, t_types)[0].tolist()
            f.write(json.dumps({"premise": a, "hypothesis": b, "fp32_logits": fp32, "int8_logits": int8},
                               ensure_ascii=False) + "\n")

    for path in (fp32_path, int8_path):
        digest = hashlib.sha256(open(path, "rb").read()).hexdigest()
        print(f"{path}\t{os.path.getsize(path)} bytes\tsha256 {digest}")


if __name__ == "__main__":
    main()
