namespace BarrierLedger.Core.Formats;

/// <summary>Collects issues for one file, keeping at most <see cref="ReaderLimits.MaxIssues"/> and summarising the rest.</summary>
internal sealed class IssueCollector(string fileName, int maxIssues)
{
    private readonly List<ReadIssue> _issues = [];
    private int _droppedErrors;
    private int _droppedWarnings;

    public string FileName { get; } = fileName;
    public bool HasErrors { get; private set; }
    public int Count => _issues.Count;

    public void Error(int? line, string message) => Add(new ReadIssue(IssueSeverity.Error, FileName, line, null, message));
    public void Warning(int? line, string message) => Add(new ReadIssue(IssueSeverity.Warning, FileName, line, null, message));
    public void ErrorAt(string jsonPath, string message) => Add(new ReadIssue(IssueSeverity.Error, FileName, null, jsonPath, message));
    public void WarningAt(string jsonPath, string message) => Add(new ReadIssue(IssueSeverity.Warning, FileName, null, jsonPath, message));

    /// <summary>
    /// Keeps issues in file order up to the limit; an error arriving at the limit takes the place of the last kept warning, so
    /// thousands of warnings never hide the error that refuses the file.
    /// </summary>
    public void Add(ReadIssue issue)
    {
        if (issue.IsError) HasErrors = true;
        if (_issues.Count < maxIssues) { _issues.Add(issue); return; }
        if (!issue.IsError) { _droppedWarnings++; return; }
        var lastWarning = _issues.FindLastIndex(i => !i.IsError);
        if (lastWarning < 0) { _droppedErrors++; return; }
        _issues.RemoveAt(lastWarning);
        _droppedWarnings++;
        _issues.Add(issue);
    }

    public void AddRange(IEnumerable<ReadIssue> issues)
    {
        foreach (var i in issues) Add(i);
    }

    public IReadOnlyList<ReadIssue> ToList()
    {
        if (_droppedErrors + _droppedWarnings == 0) return _issues;
        var parts = new List<string>();
        if (_droppedErrors > 0) parts.Add($"{_droppedErrors} further error(s)");
        if (_droppedWarnings > 0) parts.Add($"{_droppedWarnings} further warning(s)");
        return [.. _issues, new(_droppedErrors > 0 ? IssueSeverity.Error : IssueSeverity.Warning, FileName, null, null,
            $"{string.Join(" and ", parts)} not listed (limit {maxIssues} per file; errors are kept before warnings)")];
    }

    public ReadResult<T> Result<T>(T? value) where T : class => new(HasErrors ? null : value, ToList());
}
