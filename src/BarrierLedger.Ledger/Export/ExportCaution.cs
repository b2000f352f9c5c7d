namespace BarrierLedger.Ledger.Export;

/// <summary>The one caution every table and figure export carries, word for word.</summary>
public static class ExportCaution
{
    public const string Text =
        "Caution: computed barriers and rate constants are model estimates whose errors are typically a few kcal/mol " +
        "(worse for some methods and systems); they are no basis on their own for process-safety or scale-up decisions, " +
        "which follow experimental thermal-hazard testing and the institution's safety rules.";
}
