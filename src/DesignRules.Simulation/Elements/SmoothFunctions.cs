namespace DesignRules.Simulation.Elements;

/// <summary>Smooth, overflow-safe scalar functions used by the non-linear models.</summary>
internal static class SmoothFunctions
{
    /// <summary>Largest exponent evaluated exactly; beyond it exp continues linearly (keeps Newton finite).</summary>
    public const double MaxExponent = 80;

    /// <summary>exp(z) with a linear continuation above <see cref="MaxExponent"/>; <paramref name="slope"/> receives d/dz.</summary>
    public static double LimitedExp(double z, out double slope)
    {
        // e^z underflows to exactly 0 there (see Underflow): a diode's breakdown term, thousands of thermal voltages away.
        if (z < -Underflow)
        {
            slope = 0;
            return 0;
        }

        if (z <= MaxExponent)
        {
            double e = Math.Exp(z);
            slope = e;
            return e;
        }

        double top = Math.Exp(MaxExponent);
        slope = top;
        return top * (1 + z - MaxExponent);
    }

    /// <summary>
    /// Beyond this |z| e^−|z| is exactly 0 in double precision (it underflows below e^−745), so <see cref="Softplus"/> and
    /// <see cref="Logistic"/> return, bit for bit, what their full formulas give there without evaluating them: an amplifier's
    /// swing clamp is evaluated at every load with its drive thousands of clamp widths inside the swing.
    /// </summary>
    private const double Underflow = 750;

    /// <summary>
    /// Beyond this |z| 1 + e^−|z| rounds to exactly 1 (e^−40 ≈ 4e−18 is below half an ulp of 1, 2^−53 ≈ 1.1e−16), so
    /// <see cref="Softplus"/> is exactly 0 or z and <see cref="Logistic"/> exactly e^z or 1 there, bit for bit what their
    /// full formulas give: an amplifier's drive a few hundred millivolts (a few hundred clamp widths) inside its swing.
    /// </summary>
    private const double Negligible = 40;

    /// <summary>softplus(z) = ln(1 + e^z), computed without overflow.</summary>
    public static double Softplus(double z)
    {
        if (z < -Negligible) return 0;
        if (z > Negligible) return z;
        return z > 0 ? z + Math.Log(1 + Math.Exp(-z)) : Math.Log(1 + Math.Exp(z));
    }

    /// <summary>Logistic function 1/(1 + e^−z), the derivative of softplus.</summary>
    public static double Logistic(double z)
    {
        if (z < -Underflow) return 0;
        if (z > Negligible) return 1;
        if (z >= 0) return 1 / (1 + Math.Exp(-z));
        double e = Math.Exp(z);
        return z < -Negligible ? e : e / (1 + e);
    }
}
