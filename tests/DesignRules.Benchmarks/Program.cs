internal static class Program
{
    private static void Main(string[] args)
    {
        // `served-loop REPOSITORY [RUNS]`: the warm server's run repeated in this process (not a BenchmarkDotNet case).
        if (args.Length > 1 && args[0] == "served-loop")
        {
            DesignRules.Benchmarks.ServedRunLoop.Run(args[1..]);
            return;
        }

        // `design-loop REPOSITORY DESIGN [RUNS]`: the check of one design repeated in this process, its processor time per run.
        if (args.Length > 2 && args[0] == "design-loop")
        {
            DesignRules.Benchmarks.OneDesignLoop.Run(args[1..]);
            return;
        }

        BenchmarkDotNet.Running.BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
    }
}
