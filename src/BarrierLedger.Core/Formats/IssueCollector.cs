namespace BarrierLedger.Core.Formats;

/// <summary>Collects issues for one file, keeping at most <see cref="ReaderLimits.MaxIssues"/> and summarising the rest.</summary>
internal sealed class IssueCollector(string fileName, int maxIssues)
{
    private readonly List<ReadIssue> _issues = [];
    private int _dropped;

    public string FileName { get; } = fileName;
    public bool HasErrors { get; private set; }
    public int Count => _issues.Count;

    public void Error(int? line, string message) => Add(new ReadIssue(IssueSeverity.Error, FileName, line, null, message));
    public void Warning(int? line, string message) => Add(new ReadIssue(IssueSeverity.Warning, FileName, line, null, message));
    public void ErrorAt(string jsonPath, string message) => Add(new ReadIssue(IssueSeverity.Error, FileName, null, jsonPath, message));
    public void WarningAt(string jsonPath, string message) => Add(new ReadIssue(IssueSeverity.Warning, FileName, null, jsonPath, message));

    public void Add(ReadIssue issue)
    {
        if (issue.IsError) HasErrors = true;
        if (_issues.Count < maxIssues) _issues.Add(issue);
        else _dropped++;
    }

    public void AddRange(IEnumerable<ReadIssue> issues)
    {
        foreach (var i in issues) Add(i);
    }

    public IReadOnlyList<ReadIssue> ToList()
    {
        if (_dropped == 0) return _issues;
        var all = new List<ReadIssue>(_issues)
        {
            new(HasErrors ? IssueSeverity.Error : IssueSeverity.Warning, FileName, null, null,
                $"{_dropped} further issue(s) not listed (limit {maxIssues} per file)"),
        };
        return all;
    }

    public ReadResult<T> Result<T>(T? value) where T : class => new(HasErrors ? null : value, ToList());
}
