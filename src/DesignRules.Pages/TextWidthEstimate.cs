using OxyPlot;

namespace DesignRules.Pages;

/// <summary>
/// Measures text for the SVG exporter, which has no font metrics of its own. The estimate is generous (average
/// glyph width 0.62 em of a sans-serif face, common practice for layout estimates) so that legends and axis titles
/// are never clipped in a wiki's renderer; it is the same on every machine, which keeps the SVG bytes stable.
/// </summary>
internal sealed class TextWidthEstimate : RenderContextBase
{
    public override OxySize MeasureText(string text, string fontFamily, double fontSize, double fontWeight)
    {
        var lines = (text ?? string.Empty).Split('\n');
        var widest = lines.Max(l => l.Length);
        var bold = fontWeight >= 600 ? 1.08 : 1.0;
        return new OxySize(widest * fontSize * 0.62 * bold, lines.Length * fontSize * 1.2);
    }

    // Only measuring is asked of this context; the exporter draws through its own SVG context.
    public override int ClipCount => 0;

    public override void DrawLine(IList<ScreenPoint> points, OxyColor stroke, double thickness, EdgeRenderingMode edgeRenderingMode, double[] dashArray, LineJoin lineJoin) =>
        throw new NotSupportedException("measurement only");

    public override void DrawPolygon(IList<ScreenPoint> points, OxyColor fill, OxyColor stroke, double thickness, EdgeRenderingMode edgeRenderingMode, double[] dashArray, LineJoin lineJoin) =>
        throw new NotSupportedException("measurement only");

    public override void DrawText(ScreenPoint p, string text, OxyColor fill, string fontFamily, double fontSize, double fontWeight, double rotation, HorizontalAlignment halign, VerticalAlignment valign, OxySize? maxSize) =>
        throw new NotSupportedException("measurement only");

    public override void PushClip(OxyRect clippingRectangle) => throw new NotSupportedException("measurement only");

    public override void PopClip() => throw new NotSupportedException("measurement only");
}
