namespace Plumbline.Nli.Tests;

/// <summary>Loads the repository model once for all tests that need it; they run one after another to spare the CPU.</summary>
public sealed class ModelFixture : IDisposable
{
    public ModelFixture()
    {
        Model = NliModel.Load(RepositoryModel.Directory);
    }

    public NliModel Model { get; }

    public void Dispose() => Model.Dispose();
}

[CollectionDefinition(Name)]
public sealed class RepositoryModelCollection : ICollectionFixture<ModelFixture>
{
    public const string Name = "repository model";
}
