using System.Numerics;

namespace DesignRules.Simulation.Noise;

/// <summary>
/// Finds, at one frequency, the transfer of every noise source and of the input source to the output node, from the
/// small-signal system the devices loaded (matrix A and the input stimulus b, not yet factored).
/// </summary>
internal abstract class NoiseTransfer
{
    /// <summary>The class of <paramref name="method"/>.</summary>
    public static NoiseTransfer For(NoiseTransferMethod method, int size) =>
        method == NoiseTransferMethod.PerSource ? new PerSourceNoiseTransfer() : new AdjointNoiseTransfer(size);

    /// <summary>
    /// Fills <paramref name="transfers"/> (one per source) and returns the input-to-output gain; returns false with the
    /// singular unknown when the system cannot be solved.
    /// </summary>
    public abstract bool Solve(DenseLu<Complex> system, int output, IReadOnlyList<NoiseSource> sources, Complex[] transfers, out Complex gain, out int singular);
}

/// <summary>
/// Adjoint network method (Director and Rohrer, 1969): with Aᵀ·y = e_out, the output of any excitation b is
/// v_out = e_outᵀ·A⁻¹·b = yᵀ·b, so one solve of the transposed system gives every source's transfer at once.
/// </summary>
internal sealed class AdjointNoiseTransfer(int size) : NoiseTransfer
{
    private readonly DenseLu<Complex> adjoint = new(size);
    private readonly Complex[] stimulus = new Complex[size];

    public override bool Solve(DenseLu<Complex> system, int output, IReadOnlyList<NoiseSource> sources, Complex[] transfers, out Complex gain, out int singular)
    {
        int n = system.Size;
        system.Rhs.AsSpan().CopyTo(stimulus);
        var a = system.Matrix;
        var t = adjoint.Matrix;
        for (int r = 0; r < n; r++)
        {
            for (int c = 0; c < n; c++) t[(c * n) + r] = a[(r * n) + c];
        }

        Array.Clear(adjoint.Rhs);
        adjoint.Rhs[output] = Complex.One;
        gain = Complex.Zero;
        singular = adjoint.Factor();
        if (singular >= 0) return false;
        adjoint.Solve();
        var y = adjoint.Rhs;
        for (int i = 0; i < n; i++) gain += y[i] * stimulus[i];
        for (int k = 0; k < sources.Count; k++) transfers[k] = sources[k].Transfer(y);
        return true;
    }
}

/// <summary>
/// Superposition, source by source: the system is factored once per frequency and solved with each noise source
/// injected alone; the output node's value is that source's transfer. Costs one solve per source, so it serves as the
/// independent check of the adjoint method.
/// </summary>
internal sealed class PerSourceNoiseTransfer : NoiseTransfer
{
    public override bool Solve(DenseLu<Complex> system, int output, IReadOnlyList<NoiseSource> sources, Complex[] transfers, out Complex gain, out int singular)
    {
        var stimulus = system.Rhs.ToArray();
        gain = Complex.Zero;
        singular = system.Factor();
        if (singular >= 0) return false;
        stimulus.CopyTo(system.Rhs, 0);
        system.Solve();
        gain = system.Rhs[output];
        for (int k = 0; k < sources.Count; k++)
        {
            Array.Clear(system.Rhs);
            foreach (var (row, weight) in sources[k].Injection) system.Rhs[row] += weight;
            system.Solve();
            transfers[k] = system.Rhs[output];
        }

        return true;
    }
}
