namespace Plumbline.Models.Http;

/// <summary>How the HTTP backend obtains answer probabilities, decided by the set-up check.</summary>
public enum BeliefMethod
{
    /// <summary>Exact: the log-probabilities of the answer token's top alternatives.</summary>
    TokenProbabilities,

    /// <summary>Estimated: the share of sampled answers that say True or False.</summary>
    Votes,
}
