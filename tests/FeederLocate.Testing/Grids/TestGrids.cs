using FeederLocate.Core.Model;

namespace FeederLocate.Testing;

/// <summary>
/// An invented 20 kV feeder: S1 (cable, 2 km) and S2 (cable, 3 km) in line, then S3 (overhead, 5 km).
/// FI1 non-directional remote on S1, FI2 directional remote on S2, FI3 non-directional field-read on S3,
/// FI4 non-directional remote on S2.
/// </summary>
public static class TestGrids
{
    public const string BrackenfoldName = "Brackenfold 20 kV";

    public static Grid Brackenfold(string name = BrackenfoldName) => Grid.Create(
        name,
        50,
        [
            // No stated rate: the cable default of 3 faults per 100 km·year applies.
            new LineType(new LineTypeId("CAB-AL150"), Construction.Cable, 0.206, 0.116, 0.82, 0.40, 250, 320),
            new LineType(new LineTypeId("OHL-AL95"), Construction.Overhead, 0.306, 0.35, 0.454, 1.618, 5, 300, FaultsPer100KmYear: 8),
        ],
        [
            new Substation(new SubstationId("BKF"), new NodeId("BKF-BUS"), 20, new BusbarShortCircuit(250, 0.1),
                new ImpedanceOhm(0.15, 1.9), null, new Grounding(GroundingScheme.Resonant, DetuningPercent: 5, DampingPercent: 3)),
        ],
        [new Node(new NodeId("BKF-BUS")), new Node(new NodeId("N1")), new Node(new NodeId("N2"), 400, Customers: 60),
         new Node(new NodeId("N3"), 300, Customers: 45), new Node(new NodeId("N4"), 200, Customers: 30), new Node(new NodeId("N5"))],
        [
            new Segment(new SegmentId("S1"), new NodeId("N1"), new NodeId("N2"), new LineTypeId("CAB-AL150"), 2),
            new Segment(new SegmentId("S2"), new NodeId("N2"), new NodeId("N3"), new LineTypeId("CAB-AL150"), 3),
            new Segment(new SegmentId("S3"), new NodeId("N3"), new NodeId("N4"), new LineTypeId("OHL-AL95"), 5),
        ],
        [
            new SwitchingDevice(new SwitchId("CB1"), new NodeId("BKF-BUS"), new NodeId("N1"), SwitchKind.Breaker, false, true),
            new SwitchingDevice(new SwitchId("LB2"), new NodeId("N4"), new NodeId("N5"), SwitchKind.LoadBreakSwitch, true, true),
        ],
        [
            new Indicator(new IndicatorId("FI1"), new SegmentId("S1"), new NodeId("N1"), 400, 8, Directional: false, Remote: true),
            new Indicator(new IndicatorId("FI2"), new SegmentId("S2"), new NodeId("N2"), 400, 2, Directional: true, Remote: true),
            new Indicator(new IndicatorId("FI3"), new SegmentId("S3"), new NodeId("N3"), null, 8, Directional: false, Remote: false),
            new Indicator(new IndicatorId("FI4"), new SegmentId("S2"), new NodeId("N3"), 400, 8, Directional: false, Remote: true),
        ]);
}
