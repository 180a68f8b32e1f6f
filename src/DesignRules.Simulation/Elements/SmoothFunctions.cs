namespace DesignRules.Simulation.Elements;

/// <summary>Smooth, overflow-safe scalar functions used by the non-linear models.</summary>
internal static class SmoothFunctions
{
    /// <summary>Largest exponent evaluated exactly; beyond it exp continues linearly (keeps Newton finite).</summary>
    public const double MaxExponent = 80;

    /// <summary>exp(z) with a linear continuation above <see cref="MaxExponent"/>; <paramref name="slope"/> receives d/dz.</summary>
    public static double LimitedExp(double z, out double slope)
    {
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

    /// <summary>softplus(z) = ln(1 + e^z), computed without overflow.</summary>
    public static double Softplus(double z) => z > 0 ? z + Math.Log(1 + Math.Exp(-z)) : Math.Log(1 + Math.Exp(z));

    /// <summary>Logistic function 1/(1 + e^−z), the derivative of softplus.</summary>
    public static double Logistic(double z) => z >= 0 ? 1 / (1 + Math.Exp(-z)) : Math.Exp(z) / (1 + Math.Exp(z));
}
