using Plumbline.Core.Entailment;

namespace Plumbline.Nli;

/// <summary>
/// A bounded cache of scored pairs: two generations, the newest taking every store. When it holds half the
/// capacity it becomes the old generation and the one before is dropped; a hit in the old generation moves
/// the pair forward. So memory stays under the capacity however long a run is, and pairs still in use
/// (statements recur across the trees of nearby claims) survive. Pairs are keyed by their hash (<see cref="PairKey"/>),
/// so the cache keeps no statement text alive. Thread-safe.
/// </summary>
internal sealed class PairScoreCache
{
    private readonly int generationSize;
    private readonly Lock gate = new();
    private Dictionary<UInt128, ScoredPair> current = [];
    private Dictionary<UInt128, ScoredPair> previous = [];

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
        var key = PairKey.Of(pair);
        lock (gate)
        {
            if (current.TryGetValue(key, out scored!))
            {
                return true;
            }

            if (previous.Remove(key, out scored!))
            {
                Store(key, scored);
                return true;
            }

            return false;
        }
    }

    /// <summary>Stores a pair unless another caller stored it first; returns the stored value, so every caller sees identical scores.</summary>
    public ScoredPair GetOrAdd(SentencePair pair, ScoredPair scored, out bool added)
    {
        var key = PairKey.Of(pair);
        lock (gate)
        {
            if (current.TryGetValue(key, out var known) || previous.Remove(key, out known))
            {
                Store(key, known);
                added = false;
                return known;
            }

            Store(key, scored);
            added = true;
            return scored;
        }
    }

    private void Store(UInt128 key, ScoredPair scored)
    {
        if (current.Count >= generationSize)
        {
            previous = current;
            current = [];
        }

        current[key] = scored;
    }
}
