"""Generated training pairs, made reproducibly from the TRAIN premises only (never from evaluate files).

Sources (each tagged in the output so the model card can count them and ablations can drop them):
  negation       P vs an explicit negation of P (prefix or auxiliary + 'not'), both directions -> contradiction;
                 double negation and "It is true that P" -> entailment
  cohyponym      one noun replaced by a WordNet sibling (same direct hypernym) -> contradiction
  antonym        one adjective or noun replaced by a WordNet antonym -> contradiction
  hypernym       one noun replaced by its WordNet hypernym -> entailment
  number         one number word or numeral replaced by another -> contradiction
  colour         one colour word replaced by another -> contradiction
  swapped        premise and hypothesis of a training contradiction exchanged -> contradiction
"""
import random
import re

WORDNET = "/usr/share/wordnet"
STOP = set("""a an the and or but of to in on at by for with from into onto over under is are was were be been
being has have had do does did not no this that these those there here his her their its our your my some
any all one two three man woman men women person people""".split())
# Kept in training; held-out negation forms for evaluation live in evaluate.py.
PREFIXES = ["It is not true that {}", "It is false that {}", "It is not the case that {}"]
AUXILIARIES = ["is", "are", "was", "were", "can", "will", "has", "have", "could", "would", "should", "must"]
NUMBERS = ["two", "three", "four", "five", "six", "seven", "eight", "nine", "ten", "twelve", "twenty"]
COLOURS = ["red", "blue", "green", "yellow", "black", "white", "orange", "purple", "pink", "brown", "gray", "grey"]
WORD = re.compile(r"[A-Za-z]+")
DETERMINERS = set("a an the his her their its my our your this that some another each every".split())
FOLLOWERS = set("""in on at with and or of is are was were while near behind by for from to into under over
beside next as that who which during through across along outside inside""".split())


class WordNet:
    """Just enough of the WordNet 3.0 database files: first senses, hypernyms, hyponyms, antonyms."""

    def __init__(self, root=WORDNET):
        self.synsets = {}
        self.index = {}
        self.sense_counts = {}
        for pos, name in (("n", "noun"), ("v", "verb"), ("r", "adv")):
            with open(f"{root}/index.{name}", encoding="latin-1") as f:
                for line in f:
                    if not line.startswith("  "):
                        parts = line.split()
                        self.sense_counts[(pos, parts[0])] = int(parts[2])
        for pos, name in (("n", "noun"), ("a", "adj")):
            with open(f"{root}/data.{name}", encoding="latin-1") as f:
                for line in f:
                    if line.startswith("  "):
                        continue
                    head = line.split(" | ")[0].split()
                    offset, count = head[0], int(head[3], 16)
                    lemmas = [head[4 + 2 * i].lower() for i in range(count)]
                    rest = head[4 + 2 * count:]
                    pointers = []
                    for i in range(int(rest[0])):
                        symbol, target, tpos, srctgt = rest[1 + 4 * i: 5 + 4 * i]
                        pointers.append((symbol, target, "a" if tpos == "s" else tpos, int(srctgt[:2], 16)))
                    self.synsets[(pos, offset)] = (lemmas, pointers)
            with open(f"{root}/index.{name}", encoding="latin-1") as f:
                for line in f:
                    if line.startswith("  "):
                        continue
                    parts = line.split()
                    self.index[(pos, parts[0])] = parts[-int(parts[2]):]
                    self.sense_counts[(pos, parts[0])] = int(parts[2])

    def first_sense(self, word, pos):
        offsets = self.index.get((pos, word))
        return (pos, offsets[0]) if offsets else None

    def related(self, key, symbols):
        return [(p, o) for s, o, p, _ in self.synsets[key][1] if s in symbols and (p, o) in self.synsets]

    def depth(self, key, limit=20):
        d = 0
        while d < limit:
            up = self.related(key, {"@", "@i"})
            if not up:
                return d
            key, d = up[0], d + 1
        return d

    def common_lemma(self, key):
        """A single-word lemma whose most frequent sense is this synset (avoids rare readings)."""
        for lemma in self.synsets[key][0]:
            if lemma.isalpha() and self.first_sense(lemma, key[0]) == key:
                return lemma
        return None

    def mostly_noun(self, word):
        """True when the word is read as a noun more often than as anything else (by sense count)."""
        nouns = self.sense_counts.get(("n", word), 0)
        others = max(self.sense_counts.get((p, word), 0) for p in ("v", "a", "r"))
        return nouns > others and not word.endswith(("ing", "ed", "ly"))

    def cohyponyms(self, word):
        key = self.first_sense(word, "n") if self.mostly_noun(word) else None
        if not key or self.depth(key) < 6:
            return []
        out = []
        for parent in self.related(key, {"@"}):
            for sibling in self.related(parent, {"~"}):
                lemma = sibling != key and self.common_lemma(sibling)
                if lemma and lemma != word:
                    out.append(lemma)
        return out

    def hypernyms(self, word):
        key = self.first_sense(word, "n") if self.mostly_noun(word) else None
        if not key or self.depth(key) < 6:
            return []
        return [l for p in self.related(key, {"@"}) if (l := self.common_lemma(p)) and l != word]

    def antonyms(self, word):
        out = []
        for pos in ("a", "n"):
            key = self.first_sense(word, pos)
            if not key:
                continue
            lemmas, pointers = self.synsets[key]
            position = lemmas.index(word) + 1 if word in lemmas else 0
            for symbol, target, tpos, source in pointers:
                if symbol == "!" and source in (0, position) and (tpos, target) in self.synsets:
                    for lemma in self.synsets[(tpos, target)][0]:
                        if lemma.isalpha():
                            out.append(lemma)
                            break
        return out


def lower_first(sentence):
    s = sentence.strip().rstrip(".!?")
    first = s.split(" ")[0]
    keep = len(first) > 1 and first.isupper()  # an acronym keeps its capitals
    return s if keep else s[:1].lower() + s[1:]


def sentence_case(s):
    s = s.strip().rstrip(".!?")
    return s[:1].upper() + s[1:] + "."


def fix_articles(words):
    for i in range(len(words) - 1):
        if words[i].lower() in ("a", "an"):
            article = "an" if words[i + 1][:1].lower() in "aeiou" else "a"
            words[i] = article.capitalize() if words[i][0].isupper() else article
    return words


def replace_word(sentence, index, new):
    words = sentence.split(" ")
    old = words[index]
    core = WORD.search(old).group(0)
    words[index] = old.replace(core, new.capitalize() if core[0].isupper() else new, 1)
    return " ".join(fix_articles(words))


def verbal_negation(sentence):
    words = sentence.split(" ")
    for i, w in enumerate(words):
        if w.lower() in AUXILIARIES and i + 1 < len(words) and words[i + 1].lower() not in ("not", "no"):
            return " ".join(words[: i + 1] + ["not"] + words[i + 1:])
    return None


def head_noun_position(words, i):
    """A cheap stand-in for a part-of-speech tagger: a word right after a determiner and followed by
    punctuation, the end, or a function word is read as a head noun ('a dog in ...', 'the street.')."""
    if i == 0 or words[i - 1].lower() not in DETERMINERS:
        return False
    return i + 1 == len(words) or words[i][-1:] in ".,;:!?" or words[i + 1].lower() in FOLLOWERS


def substitutions(sentence, finder, rng, nouns_only=True):
    words = sentence.split(" ")
    spots = []
    for i, w in enumerate(words):
        m = WORD.fullmatch(w.strip(".,;:!?\"'"))
        if nouns_only and not head_noun_position(words, i):
            continue
        if m and len(m.group(0)) > 2 and m.group(0).lower() not in STOP and m.group(0).lower() not in NUMBERS + COLOURS:
            options = finder(m.group(0).lower())
            if options:
                spots.append((i, options))
    if not spots:
        return None
    i, options = rng.choice(spots)
    return replace_word(sentence, i, rng.choice(sorted(set(options))))


def swap_from(sentence, vocabulary, rng):
    words = sentence.split(" ")
    spots = [i for i, w in enumerate(words) if w.strip(".,;:!?").lower() in vocabulary]
    if not spots:
        return None
    i = rng.choice(spots)
    old = words[i].strip(".,;:!?").lower()
    return replace_word(sentence, i, rng.choice([v for v in vocabulary if v != old and {v, old} != {"gray", "grey"}]))


def generate(train, seed, quotas):
    """train: dict of source -> [(premise, hypothesis, label)]. Returns [(p, h, label, source)]."""
    rng = random.Random(seed)
    wordnet = WordNet()
    premises = sorted({p for name in ("snli_test", "cad_train", "cad_test") for p, _, _ in train[name]
                       if 4 <= len(p.split()) <= 30})
    longer = sorted({p for p, _, _ in train["mnli_mismatched"] if 5 <= len(p.split()) <= 30})
    rng.shuffle(premises)
    rng.shuffle(longer)
    out = []

    def take(source, label, pool, make, quota):
        made = 0
        for p in pool:
            if made >= quota:
                break
            h = make(p)
            if h and h.strip().rstrip(".") != p.strip().rstrip("."):
                out.append((p, sentence_case(h) if source == "negation" else h, label, source))
                made += 1

    neg_pool = premises[:6000] + longer[:3000]
    rng.shuffle(neg_pool)
    q = quotas["negation"] // 6
    take("negation", "contradiction", neg_pool[0:], lambda p: rng.choice(PREFIXES).format(lower_first(p)), q)
    take("negation", "contradiction", neg_pool[q:], verbal_negation, q)
    for p in neg_pool[2 * q: 3 * q]:  # the negation as premise, the original as hypothesis
        out.append((sentence_case(rng.choice(PREFIXES).format(lower_first(p))), p, "contradiction", "negation"))
    for p in neg_pool[3 * q: 4 * q]:
        v = verbal_negation(p)
        if v:
            out.append((sentence_case(v), p, "contradiction", "negation"))
    for p in neg_pool[4 * q: 5 * q]:  # double negation and plain affirmation keep the polarity
        v = verbal_negation(p)
        h = rng.choice(PREFIXES).format(lower_first(v)) if v else "It is true that " + lower_first(p)
        out.append((p, sentence_case(h), "entailment", "negation"))
    for p in neg_pool[5 * q: 6 * q]:
        out.append((p, sentence_case("It is true that " + lower_first(p)), "entailment", "negation"))

    pool = premises[:]
    rng.shuffle(pool)
    take("cohyponym", "contradiction", pool, lambda p: substitutions(p, wordnet.cohyponyms, rng), quotas["cohyponym"])
    rng.shuffle(pool)
    take("antonym", "contradiction", pool, lambda p: substitutions(p, wordnet.antonyms, rng, nouns_only=False), quotas["antonym"])
    rng.shuffle(pool)
    take("hypernym", "entailment", pool, lambda p: substitutions(p, wordnet.hypernyms, rng), quotas["hypernym"])
    rng.shuffle(pool)
    take("number", "contradiction", pool, lambda p: swap_from(p, NUMBERS, rng), quotas["number"])
    rng.shuffle(pool)
    take("colour", "contradiction", pool, lambda p: swap_from(p, COLOURS, rng), quotas["colour"])

    contradictions = [(p, h) for name in ("snli_test", "cad_train", "cad_test", "mnli_mismatched")
                      for p, h, l in train[name] if l == "contradiction"]
    rng.shuffle(contradictions)
    out.extend((h, p, "contradiction", "swapped") for p, h in contradictions[: quotas["swapped"]])
    return out


# Words WordNet lists as adjectives whose removal changes the meaning or the grammar, not just the detail.
NOT_MODIFIERS = set("""more most less least only other same such few many much several own very no not fake
former false mock non ex pseudo alleged""".split())


def adjective_positions(words, wordnet):
    """Words read as adjectives: listed as adjectives in WordNet, not mostly nouns, right before another word."""
    out = []
    for i, w in enumerate(words[:-1]):
        core = w.lower()
        if (i > 0 and core.isalpha() and len(core) > 2 and core not in STOP and core not in NOT_MODIFIERS
                and not core.endswith(("ed", "ing")) and wordnet.first_sense(core, "a") and not wordnet.mostly_noun(core)
                and words[i + 1].isalpha() and wordnet.mostly_noun(words[i + 1].lower())):
            out.append(i)
    return out


def without_adjective(sentence, wordnet, rng):
    words = sentence.split(" ")
    spots = adjective_positions(words, wordnet)
    if not spots:
        return None
    i = rng.choice(spots)
    return " ".join(fix_articles(words[:i] + words[i + 1:]))


def synonyms(wordnet, word):
    out = []
    if word.endswith(("ing", "ed")):
        return out
    for pos in (("n", "a") if wordnet.mostly_noun(word) else ("a",)):
        key = wordnet.first_sense(word, pos)
        if key:
            out += [l for l in wordnet.synsets[key][0] if l.isalpha() and l != word]
    return out


def generate_refinement(train, seed, quotas):
    """Pairs that teach that small edits which keep the meaning are not contradictions: an adjective
    dropped from the premise (entailment), the same adjective added (neutral), a WordNet synonym
    (entailment) and the sentence itself (entailment)."""
    rng = random.Random(seed + 1)
    wordnet = WordNet()
    premises = sorted({p for name in ("snli_test", "cad_train", "cad_test", "mnli_mismatched") for p, _, _ in train[name]
                       if 4 <= len(p.split()) <= 30})
    rng.shuffle(premises)
    out = []
    for p in premises:
        if sum(1 for o in out if o[3] == "deletion") >= quotas["deletion"] + quotas["insertion"]:
            break
        h = without_adjective(p, wordnet, rng)
        if h and h != p:
            out.append((p, h, "entailment", "deletion"))
    deletions = [o for o in out if o[3] == "deletion"]
    out = deletions[: quotas["deletion"]]
    out += [(h, p, "neutral", "insertion") for p, h, _, _ in deletions[quotas["deletion"]:]]
    rng.shuffle(premises)
    made = 0
    for p in premises:
        if made >= quotas["synonym"]:
            break
        h = substitutions(p, lambda w: synonyms(wordnet, w), rng, nouns_only=False)
        if h and h != p:
            out.append((p, h, "entailment", "synonym"))
            made += 1
    out += [(p, p, "entailment", "identity") for p in premises[: quotas["identity"]]]
    return out


# Pairs of everyday state words whose swap flips the meaning ("A man is sleeping." / "A man is awake.").
# A hand list (common practice): WordNet does not link most of these as antonyms.
STATE_ANTONYMS = [("sleeping", "awake"), ("asleep", "awake"), ("standing", "sitting"), ("empty", "full"),
                  ("open", "closed"), ("inside", "outside"), ("indoors", "outdoors"), ("wet", "dry"),
                  ("alive", "dead"), ("clean", "dirty"), ("hot", "cold"), ("happy", "sad"), ("young", "old"),
                  ("tall", "short"), ("fast", "slow"), ("loud", "quiet"), ("early", "late"), ("day", "night"),
                  ("asleep", "running"), ("smiling", "frowning"), ("sunny", "rainy"), ("light", "dark"),
                  ("married", "single"), ("present", "absent"), ("winning", "losing"), ("always", "never")]
CONNECTIVES = ["{a}, and {b}", "{a}, and {b}", "{a}; {b}", "{a}, and also {b}", "{a}, while {b}"]


def antonym_swap(sentence, rng):
    words = sentence.split(" ")
    spots = []
    for i, w in enumerate(words):
        core = w.strip(".,;:!?").lower()
        for a, b in STATE_ANTONYMS:
            if core == a:
                spots.append((i, b))
            elif core == b:
                spots.append((i, a))
    if not spots:
        return None
    i, new = rng.choice(spots)
    return replace_word(sentence, i, new)


def word_share(part, whole):
    """Share of the words of `part` that occur in `whole` (lower case, punctuation stripped)."""
    words = [w.strip(".,;:!?\"'").lower() for w in part.split()]
    pool = {w.strip(".,;:!?\"'").lower() for w in whole.split()}
    return sum(w in pool for w in words) / max(len(words), 1)


def conjoin(first, second, rng):
    return sentence_case(rng.choice(CONNECTIVES).format(a=first.strip().rstrip(".!?"), b=lower_first(second)))


def generate_restatements(train, seed, quotas):
    """Pairs of the shapes that fill an explanation tree, where the first model read restatements as
    contradictions: a statement and itself, a statement with an added clause or modifier against the
    statement (entailment: a statement entails its own parts) and the reverse (neutral), an entailment
    read backwards when its hypothesis is shorter (neutral), synonym swaps (entailment, both ways) and
    swaps of everyday state words (contradiction). Train premises only."""
    rng = random.Random(seed + 2)
    wordnet = WordNet()
    names = ("snli_test", "cad_train", "cad_test", "mnli_mismatched", "mnli_sni", "conjnli_adversarial")
    rows = [(p, h, l) for name in names if name in train for p, h, l in train[name]
            if 3 <= len(p.split()) <= 25 and 2 <= len(h.split()) <= 20]
    rng.shuffle(rows)
    premises = sorted({p for p, _, _ in rows})
    rng.shuffle(premises)
    out = []

    def add(source, quota, candidates):
        made = 0
        for pair in candidates:
            if made >= quota:
                break
            if pair and pair[0].strip() and pair[1].strip() and pair[0] != pair[1] or (pair and pair[2] == "entailment" and source == "identity"):
                out.append((pair[0], pair[1], pair[2], source))
                made += 1

    add("identity", quotas["identity"], ((p, p, "entailment") for p in premises))
    neutral = [(p, h) for p, h, l in rows if l == "neutral"]
    entailed = [(p, h) for p, h, l in rows if l == "entailment"]
    # P with a clause that P itself does not settle, against P (or against the added clause): entailment.
    add("conjunct_part", quotas["conjunct_part"],
        ((conjoin(p, h, rng), p, "entailment") if rng.random() < 0.5 else (conjoin(h, p, rng), p, "entailment")
         for p, h in neutral[: len(neutral) // 2]))
    add("conjunct_part", quotas["conjunct_part"] // 4,
        ((conjoin(p, h, rng), sentence_case(h), "entailment") for p, h in entailed[: len(entailed) // 2]))
    # P against P with an added clause it does not settle: neutral.
    add("conjunct_added", quotas["conjunct_added"],
        ((p, conjoin(p, h, rng), "neutral") for p, h in neutral[len(neutral) // 2:]))
    # An entailment read backwards, where the hypothesis drops detail: neutral.
    # Caption-style sources only, and only when the hypothesis reuses the premise's words (a sub-description,
    # not a paraphrase, which would entail back).
    captions = [(p, h) for name in ("snli_test", "cad_train", "cad_test") for p, h, l in train.get(name, []) if l == "entailment"]
    rng.shuffle(captions)
    add("shorter_reversed", quotas["shorter_reversed"],
        ((h, p, "neutral") for p, h in captions if len(h.split()) + 3 <= len(p.split()) and word_share(h, p) >= 0.75))
    # A modifier dropped from P (entailment) and added to it (neutral).
    rng.shuffle(premises)
    dropped = ((p, without_adjective(p, wordnet, rng)) for p in premises)
    dropped = [(p, h) for p, h in dropped if h and h != p][: quotas["modifier_dropped"] + quotas["modifier_added"]]
    add("modifier_dropped", quotas["modifier_dropped"], ((p, h, "entailment") for p, h in dropped))
    add("modifier_added", quotas["modifier_added"], ((h, p, "neutral") for p, h in dropped[quotas["modifier_dropped"]:]))
    rng.shuffle(premises)

    def synonym_pairs():
        for p in premises:
            h = substitutions(p, lambda w: synonyms(wordnet, w), rng, nouns_only=True)
            if h and h != p:
                yield (p, h, "entailment") if rng.random() < 0.5 else (h, p, "entailment")

    add("synonym", quotas["synonym"], synonym_pairs())
    rng.shuffle(premises)

    def state_pairs():
        for p in premises:
            h = antonym_swap(p, rng)
            if h and h != p:
                yield (p, h, "contradiction") if rng.random() < 0.5 else (h, p, "contradiction")

    add("state_antonym", quotas["state_antonym"], state_pairs())
    return out


def held_out_added_detail(rows, seed, count):
    """Added-detail pairs built the same way as the training shapes, but from evaluation files' sentences:
    (P with an added clause or modifier, P) entailment, and the reverse, neutral. For measuring only."""
    shapes = dict(identity=0, conjunct_part=count, conjunct_added=count, shorter_reversed=0,
                  modifier_dropped=count, modifier_added=count, synonym=0, state_antonym=0)
    made = generate_restatements({"snli_test": rows}, seed + 100, shapes)
    rng = random.Random(seed + 101)
    rng.shuffle(made)
    return [(p, h, l) for p, h, l, _ in made[:count]]



def generate_negation_crossings(train, seed, quotas):
    """Pairs where a negation stands on one side only, or on both, without making a contradiction, so that a
    'not' alone is never read as one: P against the negation of a statement P contradicts (entailment: P rules it
    out), P against the negation of a statement P leaves open (neutral), P with an added negated clause against P
    (entailment) and the reverse (neutral), and two spellings of the same negation (entailment). Train premises only."""
    rng = random.Random(seed + 3)
    names = ("snli_test", "cad_train", "cad_test", "mnli_mismatched", "mnli_sni", "conjnli_adversarial")
    rows = [(p, h, l) for name in names if name in train for p, h, l in train[name]
            if 3 <= len(p.split()) <= 25 and 2 <= len(h.split()) <= 20]
    rng.shuffle(rows)
    out = []

    def negated(sentence):
        v = verbal_negation(sentence)
        if v and rng.random() < 0.7:
            return sentence_case(v)
        return sentence_case(rng.choice(PREFIXES).format(lower_first(sentence)))

    def take(source, label, candidates, quota):
        made = 0
        for pair in candidates:
            if made >= quota:
                break
            if pair and pair[0] != pair[1]:
                out.append((pair[0], pair[1], label, source))
                made += 1

    contradicting = [(p, h) for p, h, l in rows if l == "contradiction"]
    neutral = [(p, h) for p, h, l in rows if l == "neutral"]
    take("ruled_out", "entailment", ((p, negated(h)) for p, h in contradicting), quotas["ruled_out"])
    take("left_open", "neutral", ((p, negated(h)) for p, h in neutral[: len(neutral) // 2]), quotas["left_open"])
    half = neutral[len(neutral) // 2:]
    take("negated_clause_part", "entailment",
         ((conjoin(p, negated(h), rng), p) for p, h in half[: len(half) // 2]), quotas["negated_clause_part"])
    take("negated_clause_added", "neutral",
         ((p, conjoin(p, negated(h), rng)) for p, h in half[len(half) // 2:]), quotas["negated_clause_added"])

    # Two training spellings of one negation (an auxiliary with 'not', and a fixed prefix): contractions stay
    # out, because the held-out negation check uses them.
    def respelled():
        for p, _, _ in rows:
            v = verbal_negation(p)
            if v:
                prefixed = sentence_case(rng.choice(PREFIXES).format(lower_first(p)))
                yield (sentence_case(v), prefixed) if rng.random() < 0.5 else (prefixed, sentence_case(v))

    take("negation_respelled", "entailment", respelled(), quotas["negation_respelled"])
    return out


def generate_siblings(train, seed, quota):
    """Two hypotheses written for one premise, one it entails and one it leaves open, paired with each other:
    neutral, never contradiction. Any situation where the premise and the open hypothesis both hold also makes
    the entailed one hold, so the two can be true together. They are what an explanation tree is full of: two
    statements about the same thing with different details, both compatible. Train premises only."""
    rng = random.Random(seed + 4)
    names = ("snli_test", "mnli_mismatched", "mnli_sni", "taxinli_rest")
    by_premise = {}
    for name in names:
        for p, h, l in train.get(name, []):
            by_premise.setdefault(p, {}).setdefault(l, []).append(h)
    out = []
    premises = sorted(by_premise)
    rng.shuffle(premises)
    for p in premises:
        if len(out) >= quota:
            break
        labels = by_premise[p]
        if "entailment" in labels and "neutral" in labels:
            e, n = rng.choice(labels["entailment"]), rng.choice(labels["neutral"])
            if e != n and 2 <= len(e.split()) <= 25 and 2 <= len(n.split()) <= 25:
                out.append((e, n, "neutral", "sibling") if rng.random() < 0.5 else (n, e, "neutral", "sibling"))
    return out


FRONTED = re.compile(r"^((?:In|On|At|During|After|Before|By|For|Since|Until|Last|This|Earlier|Later|Over|Under|Within|"
                     r"Throughout|Despite|According to) [^,]{2,48}), (.{12,})$")
REPORTED = re.compile(r"^([A-Z][^,]{2,48}?) (said|says|reported|reports|added|noted|stated|announced) (?:that )?(.{12,})$")
RESPELLINGS = [("per cent", "percent"), ("percent", "%"), ("United States", "U.S."), ("U.S.", "United States"),
               ("does not", "doesn't"), ("do not", "don't"), ("is not", "isn't"), ("cannot", "can't"),
               ("approximately", "about"), ("more than", "over"), ("Mister", "Mr."),
               ("because", "since"), ("children", "kids"), ("begin", "start"), ("purchase", "buy")]
NUMBER_WORDS = ["zero", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine", "ten"]
NUMBER_FIGURES = [str(n) for n in range(2, 11)]


def fronted_moved(sentence):
    """'In 1990, the firm moved.' -> 'The firm moved in 1990.': the same statement in another order."""
    m = FRONTED.match(sentence.strip())
    if not m:
        return None
    front, rest = m.group(1), m.group(2).strip().rstrip(".!?")
    return sentence_case(f"{rest} {lower_first(front)}") if not rest.endswith("?") else None


def reported_moved(sentence):
    """'The mayor said that taxes will rise.' -> 'Taxes will rise, the mayor said.'"""
    m = REPORTED.match(sentence.strip())
    if not m or m.group(1).split()[0].lower() in ("it", "there", "this", "that", "what"):
        return None
    speaker, verb, said = m.group(1), m.group(2), m.group(3).strip().rstrip(".!?")
    return sentence_case(f"{said}, {lower_first(speaker)} {verb}")


def respelt(sentence, rng):
    """One word or phrase written another way with the same meaning: a number as a word or figure, a common
    abbreviation or contraction, an everyday synonym."""
    words = sentence.split(" ")
    numbers = [i for i, w in enumerate(words)
               if w.lower().strip(".,;:") in NUMBER_WORDS[2:] or w.strip(".,;:") in NUMBER_FIGURES]
    if numbers and rng.random() < 0.5:
        i = rng.choice(numbers)
        core = words[i].strip(".,;:")
        new = str(NUMBER_WORDS.index(core.lower())) if core.lower() in NUMBER_WORDS else NUMBER_WORDS[int(core)]
        words[i] = words[i].replace(core, new, 1)
        return " ".join(words)
    options = [(a, b) for a, b in RESPELLINGS if re.search(rf"(?<![\w.]){re.escape(a)}(?!\w)", sentence)]
    if not options:
        return None
    a, b = rng.choice(options)
    return re.sub(rf"(?<![\w.]){re.escape(a)}(?!\w)", b, sentence, count=1)


def generate_respellings(train, seed, quotas):
    """The same statement in other words or another order, entailment both ways: a fronted phrase moved to the
    end, a reported clause put before its speaker, a number or common phrase respelled. Long sentences from the
    MultiNLI, ConjNLI and SNLI training premises, the length of news and explanation sentences."""
    rng = random.Random(seed + 4)
    names = ("mnli_mismatched", "mnli_sni", "taxinli_rest", "conjnli_adversarial", "snli_test", "cad_train")
    premises = sorted({p for name in names if name in train for p, _, _ in train[name] if 6 <= len(p.split()) <= 45})
    rng.shuffle(premises)
    out = []
    for source, make in (("fronted_moved", fronted_moved), ("reported_moved", reported_moved),
                         ("respelt", lambda p: respelt(p, rng))):
        made = 0
        for p in premises:
            if made >= quotas.get(source, 0):
                break
            h = make(p)
            if h and h != p:
                out.append((p, h, "entailment", source) if rng.random() < 0.5 else (h, p, "entailment", source))
                made += 1
        rng.shuffle(premises)
    return out
