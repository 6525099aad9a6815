using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

// The snake (boustrophedon) order is the reflected mixed-radix Gray code: consecutive codes differ by +-1 in exactly
// one digit (Knuth, The Art of Computer Programming 4A (2011), sec. 7.2.1.1, "reflected mixed-radix Gray code").
public class ScanGridTests
{
    private static ScanGrid Grid(params int[] sizes) =>
        new(sizes.Select((n, d) => new ScanAxis("a" + d, ScanAxis.Linear(0, 1, n), AxisSpacing.Linear)).ToArray(), temperatureK: 2);

    public static TheoryData<int[]> Shapes => new() { new[] { 5 }, new[] { 3, 4 }, new[] { 4, 3 }, new[] { 2, 3, 4 }, new[] { 3, 1, 3 }, new[] { 3, 3, 2 } };

    [Theory, MemberData(nameof(Shapes))]
    public void Snake_visits_every_point_once_and_steps_to_a_neighbour(int[] sizes)
    {
        var grid = Grid(sizes);
        var order = grid.SnakeOrder().ToList();
        Assert.Equal(sizes.Aggregate(1, (a, b) => a * b), order.Count);
        Assert.Equal(order.Count, order.Distinct().Count());
        for (int s = 1; s < order.Count; s++)
        {
            var a = grid.IndexOf(order[s - 1]); var b = grid.IndexOf(order[s]);
            int distance = a.Zip(b, (x, y) => Math.Abs(x - y)).Sum();
            Assert.True(distance == 1, $"step {s}: [{string.Join(",", a)}] -> [{string.Join(",", b)}]");
        }
    }

    [Fact]
    public void Point_ids_are_row_major_and_independent_of_visit_order()
    {
        var grid = Grid(2, 3);
        // Row-major: last axis fastest, id = i0 * 3 + i1.
        Assert.Equal(5, grid.PointId([1, 2]));
        Assert.Equal(new[] { 1, 0 }, grid.IndexOf(3));
        Assert.Equal(new[] { 0, 1, 2, 5, 4, 3 }, grid.SnakeOrder().ToArray());
        var p = grid.Point(4);
        Assert.Equal(4, p.Id);
        Assert.Equal(1.0, p.AxisValues[0]);
        Assert.Equal(0.5, p.AxisValues[1]);
    }

    [Theory]
    [InlineData(1)] [InlineData(2)] [InlineData(3)] [InlineData(7)] [InlineData(24)] [InlineData(30)]
    public void Shards_are_disjoint_contiguous_runs_that_cover_the_grid(int n)
    {
        var grid = Grid(2, 3, 4);
        var snake = grid.SnakeOrder().ToList();
        var all = new List<int>();
        for (int i = 0; i < n; i++)
        {
            var shard = grid.Shard(i, n);
            if (shard.Count > 0)
            {
                int start = snake.IndexOf(shard[0]);
                Assert.Equal(snake.Skip(start).Take(shard.Count), shard);
            }
            Assert.InRange(shard.Count, grid.Count / n, grid.Count / n + 1);
            all.AddRange(shard);
        }
        Assert.Equal(grid.Count, all.Count);
        Assert.Equal(Enumerable.Range(0, grid.Count), all.Order());
    }

    [Fact]
    public void Ties_get_free_variables_substituted_and_grid_json_round_trips()
    {
        var axes = new[]
        {
            new ScanAxis("V", [50.0, 100.0], AxisSpacing.Linear),
            new ScanAxis("ratio", [0.25, 0.5], AxisSpacing.Linear, IsFreeVariable: true),
        };
        var grid = new ScanGrid(axes, [new("lso", "20")], [new("m", "ratio * lso + 1e-3*ratio2")], 2.0);
        var p = grid.Point(grid.PointId([1, 0]));
        Assert.Equal("100", p.Override("V"));
        Assert.Equal("20", p.Override("lso"));
        Assert.Equal("(0.25) * lso + 1e-3*ratio2", p.Override("m"));
        Assert.Null(p.Override("ratio"));
        Assert.Equal(2.0, p.TemperatureK);

        var back = ScanGrid.FromJson(grid.ToJson());
        Assert.Equal(grid.Count, back.Count);
        Assert.Equal(p.Overrides, back.Point(p.Id).Overrides);
        Assert.True(back.Axes[1].IsFreeVariable);
    }

    [Fact]
    public void Temperature_axis_in_meV_is_converted_to_kelvin()
    {
        // 1 meV / k_B = 11.604518 K (CODATA 2018 exact e and k_B).
        var t = new ScanAxis("T", [1.0], AxisSpacing.Explicit, KelvinPerUnit: 1e-3 * 1.602176634e-19 / 1.380649e-23, Unit: "meV");
        var grid = new ScanGrid([t]);
        Assert.Equal(11.604518, grid.Point(0).TemperatureK, 5);
        Assert.Empty(grid.Point(0).Overrides);
    }
}
