namespace Plumbline.Nli;

public enum NliTokenizerKind
{
    /// <summary>BERT-style WordPiece from vocab.txt: [CLS] premise [SEP] hypothesis [SEP].</summary>
    WordPiece,

    /// <summary>Byte-level BPE from vocab.json and merges.txt (RoBERTa-style &lt;s&gt; a &lt;/s&gt;&lt;/s&gt; b &lt;/s&gt;, or [CLS]/[SEP] when the vocabulary has those).</summary>
    ByteLevelBpe,

    /// <summary>
    /// A SentencePiece model file (Unigram or BPE), as DeBERTa-v3 (spm.model: [CLS] a [SEP] b [SEP]) and XLM-R
    /// (sentencepiece.bpe.model: &lt;s&gt; a &lt;/s&gt;&lt;/s&gt; b &lt;/s&gt;, fairseq ids) ship.
    /// </summary>
    SentencePiece,
}
