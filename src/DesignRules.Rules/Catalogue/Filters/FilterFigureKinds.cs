namespace DesignRules.Rules.Catalogue.Filters;

/// <summary>The figure kinds of one judged filter figure (f0, centre frequency, Q, pass-band gain), by its requirement key.</summary>
internal sealed record FilterFigureKinds(FigureKind Measured, FigureKind Deviation, FigureKind WorstLow, FigureKind WorstHigh, FigureKind WorstDeviation, FigureKind ShareWithin)
{
    public static FilterFigureKinds F0 { get; } = new(FigureKinds.MeasuredF0, FigureKinds.F0Deviation, FigureKinds.WorstCaseF0Low,
        FigureKinds.WorstCaseF0High, FigureKinds.WorstCaseF0Deviation, FigureKinds.F0ShareWithin);

    public static FilterFigureKinds Centre { get; } = new(FigureKinds.MeasuredCentre, FigureKinds.CentreDeviation, FigureKinds.WorstCaseCentreLow,
        FigureKinds.WorstCaseCentreHigh, FigureKinds.WorstCaseCentreDeviation, FigureKinds.CentreShareWithin);

    public static FilterFigureKinds Q { get; } = new(FigureKinds.MeasuredQ, FigureKinds.QDeviation, FigureKinds.WorstCaseQLow,
        FigureKinds.WorstCaseQHigh, FigureKinds.WorstCaseQDeviation, FigureKinds.QShareWithin);

    public static FilterFigureKinds PassbandGain { get; } = new(FigureKinds.MeasuredPassbandGain, FigureKinds.PassbandGainDeviation,
        FigureKinds.WorstCasePassbandGainLow, FigureKinds.WorstCasePassbandGainHigh, FigureKinds.WorstCasePassbandGainDeviation, FigureKinds.PassbandGainShareWithin);

    /// <summary>The kinds of the figure a requirement key names: <c>cutoff</c>, <c>centre</c>, <c>q</c> or <c>passband-gain</c>.</summary>
    public static FilterFigureKinds For(string key) => key switch
    {
        "centre" => Centre,
        "q" => Q,
        "passband-gain" => PassbandGain,
        _ => F0,
    };
}
