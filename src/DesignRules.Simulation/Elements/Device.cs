namespace DesignRules.Simulation.Elements;

/// <summary>
/// A compiled element of one analysis run: knows its unknown indices and loads its equations. Devices are created
/// fresh for every analysis from the circuit's element definitions, so circuits can be analysed concurrently.
/// </summary>
internal abstract class Device(string id)
{
    /// <summary>Element id.</summary>
    public string Id { get; } = id;

    /// <summary>Loads the linearised equations at the present guess.</summary>
    public abstract void Load(LoadContext context);

    /// <summary>
    /// Stores the charge of each of the device's integrated states at the present guess and updates its iteration memory,
    /// exactly as <see cref="Load"/> does, without stamping anything: a transient needs the charges of each accepted
    /// solution, and loading every stamp once more only for them cost a tenth of its time (the system is cleared
    /// before the next iteration reads it).
    /// </summary>
    public abstract void StoreCharges(LoadContext context);

    /// <summary>
    /// True when the device's DC equations are linear in the unknowns, with a right-hand side that does not depend on them
    /// (resistors, sources, and capacitors and inductors, which are open and short in DC): a solve that knows this may
    /// load it once instead of at every iterate. False (the safe answer) for anything else.
    /// </summary>
    public virtual bool IsLinearInDc => false;

    /// <summary>Loads the small-signal complex equations at the operating point.</summary>
    public abstract void LoadAc(AcLoadContext context);

    /// <summary>Called once before a new solve starts from scratch (resets junction-limiting memory).</summary>
    public virtual void Reset()
    {
    }

    /// <summary>
    /// Called before a solve that starts from a known solution <paramref name="x"/> (a warm start): iteration memory is
    /// set to agree with it, so that the first iteration is not limited as if it jumped from zero.
    /// </summary>
    public virtual void Prime(double[] x)
    {
    }
}
