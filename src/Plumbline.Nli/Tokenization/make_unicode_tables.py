"""Writes the two Unicode tables the C# WordPiece tokenizer embeds, from the Unicode Character Database of the
Python that runs this script (the same data the model recipe's reference tokenizer uses), so the tokenizer does
not depend on the runtime's ICU (absent in invariant-globalization builds) nor on its Unicode version.

uncased-fold.txt: for every code point whose uncased folding is not itself, the folded code points. Uncased
folding is what an uncased WordPiece vocabulary expects of a character: lower-case it, decompose it canonically
(NFD) and drop the non-spacing marks (category Mn), so "É" becomes "e". Hangul syllables decompose
algorithmically and are left out.

unassigned.txt: ranges of code points unassigned (category Cn) in this Unicode version. The reference tokenizer
drops them as control characters, including characters that newer Unicode versions assign.

    python3 make_unicode_tables.py   (run from this folder)
"""
import sys
import unicodedata

ORIGIN = f"Unicode {unicodedata.unidata_version}; made by make_unicode_tables.py with Python {sys.version.split()[0]}"


def fold(ch):
    decomposed = unicodedata.normalize("NFD", ch.lower())
    return "".join(c for c in decomposed if unicodedata.category(c) != "Mn")


with open("uncased-fold.txt", "w", encoding="ascii", newline="\n") as out:
    out.write(f"# uncased folding (lower-case, NFD, drop Mn); {ORIGIN}\n")
    out.write("# code point<TAB>folded code points (space-separated, empty when the character is dropped)\n")
    for cp in range(0x110000):
        if 0xD800 <= cp <= 0xDFFF or 0xAC00 <= cp <= 0xD7A3:
            continue
        ch = chr(cp)
        folded = fold(ch)
        if folded != ch:
            out.write(f"{cp:X}\t{' '.join(f'{ord(c):X}' for c in folded)}\n")

with open("unassigned.txt", "w", encoding="ascii", newline="\n") as out:
    out.write(f"# unassigned code points (category Cn); {ORIGIN}\n")
    out.write("# first<TAB>last (inclusive)\n")
    start = None
    for cp in range(0x110001):
        unassigned = cp < 0x110000 and unicodedata.category(chr(cp)) == "Cn"
        if unassigned and start is None:
            start = cp
        elif not unassigned and start is not None:
            out.write(f"{start:X}\t{cp - 1:X}\n")
            start = None
