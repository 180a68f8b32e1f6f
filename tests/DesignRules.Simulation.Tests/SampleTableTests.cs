using System.Runtime.CompilerServices;
using DesignRules.Simulation.Elements;
using DesignRules.Simulation.Results;

namespace DesignRules.Simulation.Tests;

/// <summary>
/// The table a transient records its samples into keeps them in chunks below the large-object heap's threshold (85,000
/// bytes, the runtime's documented limit), and reads back every value as stored, across chunk boundaries, by row and by column.
/// </summary>
public sealed class SampleTableTests
{
    [Theory]
    [InlineData(36, 4800, 3600)] // a settled transient's table: sized for more rows than it records
    [InlineData(36, 64, 1000)]   // sized too small: grows past the first chunk
    [InlineData(1, 3, 700)]      // one value per row, a first chunk grown by doubling
    [InlineData(161, 161, 161)]  // an AC sweep's count known in advance
    public void Values_read_back_as_stored_across_chunks(int width, int sizedFor, int rows)
    {
        var table = new SampleTable<double>(width, sizedFor);
        for (int r = 0; r < rows; r++)
        {
            var row = table.AddRow();
            Assert.Equal(width, row.Length);
            for (int c = 0; c < width; c++) row[c] = Stored(r, c);
        }

        Assert.Equal(rows, table.Count);
        Assert.True(table.RowsPerChunk * width * sizeof(double) <= SampleTable<double>.ChunkBytes);
        Assert.True(SampleTable<double>.ChunkBytes < 85_000);
        for (int c = 0; c < width; c++)
        {
            var column = table.Column(c);
            Assert.Equal(rows, column.Length);
            for (int r = 0; r < rows; r++)
            {
                Assert.Equal(Stored(r, c), column[r]);
                Assert.Equal(Stored(r, c), table[r, c]);
            }
        }

        Assert.All(table.Column(-1), v => Assert.Equal(0.0, v));
    }

    [Fact]
    public void Amplifier_samples_are_kept_in_chunks_of_their_own_size()
    {
        const int rows = 5000;
        var table = new SampleTable<AmplifierSample>(4, rows);
        Assert.True(table.RowsPerChunk * 4 * Unsafe.SizeOf<AmplifierSample>() <= SampleTable<AmplifierSample>.ChunkBytes);
        for (int r = 0; r < rows; r++)
        {
            var row = table.AddRow();
            for (int c = 0; c < 4; c++) row[c] = new AmplifierSample((r + c) % 3 == 0, false, false, false, 0, Stored(r, c), 0);
        }

        for (int c = 0; c < 4; c++)
        {
            var column = table.Column(c);
            for (int r = 0; r < rows; r++)
            {
                Assert.Equal(Stored(r, c), column[r].OutputCurrent);
                Assert.Equal((r + c) % 3 == 0, column[r].SlewLimited);
            }
        }
    }

    private static double Stored(int row, int column) => (row * 1000.0) + column + 0.25;
}
