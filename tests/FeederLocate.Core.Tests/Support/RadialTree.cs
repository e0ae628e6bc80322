using FeederLocate.Core.Model;

namespace FeederLocate.Core.Tests.Support;

/// <summary>
/// A walk of a grid from its buses over segments and closed switches, written for the tests and
/// sharing no code with the engine's topology, so that engine results can be checked against it.
/// Assumes a radial switching state (the tests that use it give one).
/// </summary>
public sealed class RadialTree
{
    private readonly Grid _grid;
    private readonly int[] _substationOfNode;
    private readonly int[] _parentNode;
    private readonly int[] _suppliedEnd;
    private readonly int[] _farEnd;
    private readonly List<int>[] _children;
    private readonly List<(bool IsSegment, int Index, int Child)>[] _childEdges;
    private readonly double[] _capacitanceBeyondF;
    private readonly double[] _totalCapacitanceF;

    public RadialTree(Grid grid, Func<SwitchingDevice, bool> isClosed)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(isClosed);
        _grid = grid;
        var n = grid.Nodes.Length;
        _substationOfNode = Enumerable.Repeat(-1, n).ToArray();
        _parentNode = Enumerable.Repeat(-1, n).ToArray();
        _suppliedEnd = Enumerable.Repeat(-1, grid.Segments.Length).ToArray();
        _farEnd = Enumerable.Repeat(-1, grid.Segments.Length).ToArray();
        _children = [.. Enumerable.Range(0, n).Select(_ => new List<int>())];
        _childEdges = [.. Enumerable.Range(0, n).Select(_ => new List<(bool, int, int)>())];
        _capacitanceBeyondF = new double[n];
        _totalCapacitanceF = new double[grid.Substations.Length];

        var incident = Enumerable.Range(0, n).Select(_ => new List<(bool IsSegment, int Index, int Other)>()).ToArray();
        for (var i = 0; i < grid.Segments.Length; i++)
        {
            var s = grid.Segments[i];
            int a = Index(s.From), b = Index(s.To);
            incident[a].Add((true, i, b));
            incident[b].Add((true, i, a));
        }

        for (var i = 0; i < grid.Switches.Length; i++)
        {
            var s = grid.Switches[i];
            if (!isClosed(s))
            {
                continue;
            }

            int a = Index(s.From), b = Index(s.To);
            incident[a].Add((false, i, b));
            incident[b].Add((false, i, a));
        }

        var order = new List<int>();
        for (var sub = 0; sub < grid.Substations.Length; sub++)
        {
            var bus = Index(grid.Substations[sub].BusNode);
            if (_substationOfNode[bus] >= 0)
            {
                continue;
            }

            _substationOfNode[bus] = sub;
            var queue = new Queue<int>([bus]);
            while (queue.TryDequeue(out var u))
            {
                order.Add(u);
                foreach (var (isSegment, index, v) in incident[u])
                {
                    if (_substationOfNode[v] >= 0)
                    {
                        continue;
                    }

                    _substationOfNode[v] = sub;
                    _parentNode[v] = u;
                    _children[u].Add(v);
                    _childEdges[u].Add((isSegment, index, v));
                    if (isSegment)
                    {
                        _suppliedEnd[index] = u;
                        _farEnd[index] = v;
                    }

                    queue.Enqueue(v);
                }
            }
        }

        // Bottom-up: the capacitance of every segment fed through a node.
        for (var k = order.Count - 1; k >= 0; k--)
        {
            var v = order[k];
            foreach (var (isSegment, index, child) in _childEdges[v])
            {
                _capacitanceBeyondF[v] += _capacitanceBeyondF[child]
                    + (isSegment ? SegmentCapacitanceF(index) : 0);
            }

            if (_parentNode[v] < 0)
            {
                _totalCapacitanceF[_substationOfNode[v]] = _capacitanceBeyondF[v];
            }
        }
    }

    public static RadialTree Normal(Grid grid) => new(grid, s => !s.NormallyOpen);

    public int Index(NodeId node) => _grid.NodeIndex(node);

    public int SubstationOf(int node) => _substationOfNode[node];

    public int ParentOf(int node) => _parentNode[node];

    public int SuppliedEndOf(int segment) => _suppliedEnd[segment];

    public int FarEndOf(int segment) => _farEnd[segment];

    /// <summary>The edges from <paramref name="node"/> to the nodes it feeds: segments and closed switches.</summary>
    public IReadOnlyList<(bool IsSegment, int Index, int Child)> ChildEdges(int node) => _childEdges[node];

    /// <summary>c0 · length of one segment, F per phase.</summary>
    public double SegmentCapacitanceF(int segment)
    {
        var s = _grid.Segments[segment];
        return _grid.LineTypeOf(s).C0NfPerKm * 1e-9 * s.LengthKm;
    }

    /// <summary>Capacitance of every segment fed through <paramref name="node"/>, not counting the edge into it, F.</summary>
    public double CapacitanceBeyondF(int node) => _capacitanceBeyondF[node];

    /// <summary>Capacitance of every energised segment fed from substation <paramref name="substation"/>, F.</summary>
    public double TotalCapacitanceF(int substation) => _totalCapacitanceF[substation];

    /// <summary>True when <paramref name="node"/> is <paramref name="ancestor"/> or is fed through it.</summary>
    public bool IsAtOrBeyond(int ancestor, int node)
    {
        for (var v = node; v >= 0; v = _parentNode[v])
        {
            if (v == ancestor)
            {
                return true;
            }
        }

        return false;
    }
}
