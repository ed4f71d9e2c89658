namespace Plumbline.Core.Language;

/// <summary>Why the engine asks the model to write text; part of every request fingerprint.</summary>
public enum GenerationPurpose
{
    /// <summary>"&lt;statement&gt;? True/False, because ..." — an explanation for one answer.</summary>
    Abduction,

    /// <summary>Rewrite a statement so that it says the opposite.</summary>
    Negation,
}
