"""Readers for the NLI files named in the data SOURCES.md, returning (premise, hypothesis, label)."""
import csv
import json

LABELS = ["entailment", "neutral", "contradiction"]


def read_csv_pairs(path):
    with open(path, encoding="utf-8", newline="") as f:
        for row in csv.DictReader(f):
            if row["label"] in LABELS:
                yield row["sentence1"], row["sentence2"], row["label"]


def read_cad_tsv(path):
    with open(path, encoding="utf-8") as f:
        next(f)
        for line in f:
            parts = line.rstrip("\n").split("\t")
            if len(parts) >= 3 and parts[2] in LABELS:
                yield parts[0], parts[1], parts[2]


def read_taxinli(path, exclude_ids):
    with open(path, encoding="utf-8", newline="") as f:
        reader = csv.reader(f, delimiter="\t", quoting=csv.QUOTE_NONE)
        header = next(reader)
        pid = header.index("pairID")
        for row in reader:
            if len(row) <= pid or row[pid] in exclude_ids or row[2] not in LABELS:
                continue
            yield row[0], row[1], row[2]


def read_breaking(path):
    with open(path, encoding="utf-8") as f:
        for line in f:
            obj = json.loads(line)
            if obj["gold_label"] in LABELS:
                yield obj["sentence1"], obj["sentence2"], obj["gold_label"]


def pair_ids(path):
    with open(path, encoding="utf-8", newline="") as f:
        return {row["pairID"] for row in csv.DictReader(f)}


def train_sources(data):
    """The files marked 'train' in SOURCES.md."""
    mnli_dev_ids = pair_ids(f"{data}/mnli/tikquuss_multinli_1.0_dev_matched.csv") | pair_ids(
        f"{data}/mnli/tikquuss_multinli_1.0_dev_mismatched.csv")
    return {
        "mnli_mismatched": list(read_csv_pairs(f"{data}/mnli/tikquuss_multinli_1.0_dev_mismatched.csv")),
        "snli_test": list(read_csv_pairs(f"{data}/snli/tikquuss_snli_1.0_test.csv")),
        "cad_train": list(read_cad_tsv(f"{data}/cad_snli/all_combined/train.tsv")),
        "cad_test": list(read_cad_tsv(f"{data}/cad_snli/all_combined/test.tsv")),
        "taxinli_rest": list(read_taxinli(f"{data}/mnli/taxinli10k.tsv", mnli_dev_ids)),
    }


def evaluate_sources(data):
    """The files marked 'evaluate' in SOURCES.md."""
    return {
        "mnli_matched": list(read_csv_pairs(f"{data}/mnli/tikquuss_multinli_1.0_dev_matched.csv")),
        "snli_dev": list(read_csv_pairs(f"{data}/snli/tikquuss_snli_1.0_dev.csv")),
        "breaking_nli": list(read_breaking(f"{data}/breaking_nli/dataset.jsonl")),
        "cad_dev": list(read_cad_tsv(f"{data}/cad_snli/all_combined/dev.tsv")),
    }


def read_extra_tsv(path, labels=LABELS):
    """The extra/ TSV layout: sentence1, sentence2, gold_label[, orig_label], one header line."""
    with open(path, encoding="utf-8") as f:
        next(f)
        for line in f:
            parts = line.rstrip("\n").split("\t")
            if len(parts) >= 3 and parts[2] in labels:
                yield parts[0], parts[1], parts[2]


CURRICULUM_TRAIN = ("boolean", "comparative", "conditional", "counting", "negation", "quantifier")


def extra_train_sources(extra, taxinli_rows=()):
    """The files extra/SOURCES.md marks 'train'. mnli_sni pairs that also occur in TaxiNLI's training rows are
    dropped so that no pair is seen twice per epoch."""
    seen = {(p, h) for p, h, _ in taxinli_rows}
    out = {
        "conjnli_adversarial": list(read_extra_tsv(f"{extra}/conjnli/adversarial_train_15k.tsv")),
        "monotonicity": list(read_extra_tsv(f"{extra}/curriculum/monotonicity_infer/train.tsv", ("entailment", "neutral"))),
        "mnli_sni": [r for r in read_extra_tsv(f"{extra}/mnli_sni/train.tsv") if (r[0], r[1]) not in seen],
    }
    for task in CURRICULUM_TRAIN:
        out["curriculum_" + task] = list(read_extra_tsv(f"{extra}/curriculum/{task}/train.tsv"))
    return out


def extra_evaluate_sources(extra):
    """Evaluation-only files of extra/: 3-way where the file is 3-way; 2-way files keep 'not_entailment'."""
    out = {"conj_dev": list(read_extra_tsv(f"{extra}/conjnli/conj_dev.tsv"))}
    two_way = ("entailment", "not_entailment")
    out["paraphrase_val"] = (list(read_extra_tsv(f"{extra}/curriculum/syntactic_variation/val.tsv", two_way))
                             + list(read_extra_tsv(f"{extra}/curriculum/syntactic_variation/val_not_entailment.tsv", two_way)))
    out["paraphrase_train"] = (list(read_extra_tsv(f"{extra}/curriculum/syntactic_variation/train.tsv", two_way))
                               + list(read_extra_tsv(f"{extra}/curriculum/syntactic_variation/train_not_entailment.tsv", two_way)))
    return out
