using Plumbline.Core.Entailment;

namespace Plumbline.Nli;

/// <summary>
/// A bounded cache of scored pairs: two generations, the newest taking every store. When it holds half the
/// capacity it becomes the old generation and the one before is dropped; a hit in the old generation moves
/// the pair forward. So memory stays under the capacity however long a run is, and pairs still in use
/// (statements recur across the trees of nearby claims) survive. Thread-safe.
/// </summary>
internal sealed class PairScoreCache
{
    private readonly int generationSize;
    private readonly Lock gate = new();
    private Dictionary<SentencePair, ScoredPair> current = [];
    private Dictionary<SentencePair, ScoredPair> previous = [];

    public PairScoreCache(int capacity)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(capacity, 2);
        generationSize = capacity / 2;
    }

    public int Count
    {
        get
        {
            lock (gate)
            {
                return current.Count + previous.Count;
            }
        }
    }

    public bool TryGet(SentencePair pair, out ScoredPair scored)
    {
        lock (gate)
        {
            if (current.TryGetValue(pair, out scored!))
            {
                return true;
            }

            if (previous.Remove(pair, out scored!))
            {
                Store(pair, scored);
                return true;
            }

            return false;
        }
    }

    /// <summary>Stores a pair unless another caller stored it first; returns the stored value, so every caller sees identical scores.</summary>
    public ScoredPair GetOrAdd(SentencePair pair, ScoredPair scored, out bool added)
    {
        lock (gate)
        {
            if (current.TryGetValue(pair, out var known) || previous.Remove(pair, out known))
            {
                Store(pair, known);
                added = false;
                return known;
            }

            Store(pair, scored);
            added = true;
            return scored;
        }
    }

    private void Store(SentencePair pair, ScoredPair scored)
    {
        if (current.Count >= generationSize)
        {
            previous = current;
            current = [];
        }

        current[pair] = scored;
    }
}
