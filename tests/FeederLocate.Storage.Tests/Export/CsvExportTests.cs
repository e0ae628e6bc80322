using System.Globalization;
using CsCheck;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Learning;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;
using FeederLocate.Storage.Export;
using FeederLocate.Storage.Tests.Support;

namespace FeederLocate.Storage.Tests.Export;

public class CsvExportTests
{
    [Fact]
    public void A_note_with_a_comma_a_quote_and_a_newline_is_quoted_as_RFC_4180_says()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        store.Append(TestGrids.Brackenfold(), TestIncidents.EarthFault(),
            new OutcomeLogged(new SegmentId("S3"), FaultType.LG, "tree", "Oak on line, \"big\" one\nnear N4"), new Actor("cli"));
        var text = new StringWriter();

        CsvExport.WriteIncidents(store.Incidents(), text);

        Assert.Equal(
            "id,grid,reportedAt,status,faultType,confirmedSegment,cause,notes,events\r\n"
            + "1,Brackenfold 20 kV,2026-03-14T05:40:00.0000000Z,closed,LG,S3,tree,\"Oak on line, \"\"big\"\" one\nnear N4\",3\r\n",
            text.ToString());
    }

    [Fact]
    public void Every_incident_is_a_row_that_reads_back_field_for_field()
    {
        using var db = new TempDatabase();
        using var store = IncidentStore.Open(db.Path);
        store.OpenIncident("Ferncombe, \"north\" 11 kV", TestIncidents.EarthFault() with { FaultType = null }, new Actor("cli"));
        store.Append(TestGrids.Brackenfold(), TestIncidents.EarthFault(), new OutcomeLogged(new SegmentId("S1"), Cause: "joint\r\nfailure"), new Actor("cli"));
        var text = new StringWriter();

        CsvExport.WriteIncidents(store.Incidents(), text);

        var rows = CsvText.Read(text.ToString());
        Assert.Equal(3, rows.Count);
        Assert.Equal(["1", "Ferncombe, \"north\" 11 kV", "2026-03-14T05:40:00.0000000Z", "open", "unknown", "", "", "", "1"], rows[1]);
        Assert.Equal(["2", "Brackenfold 20 kV", "2026-03-14T05:40:00.0000000Z", "closed", "LG", "S1", "joint\r\nfailure", "", "3"], rows[2]);
    }

    [Fact]
    public void Any_fields_read_back_unchanged()
    {
        var fields = Gen.String[Gen.Char["ab ,\"\r\n;é"], 0, 12].List[1, 6];
        fields.Sample(record =>
        {
            var text = new StringWriter();

            Csv.WriteRow(text, record);

            Assert.Equal([record], CsvText.Read(text.ToString()));
        });
    }

    [Fact]
    public void Indicator_statistics_have_one_row_per_indicator_with_counts_and_rates()
    {
        var observations = Enumerable.Repeat(new IndicatorObservation(new IndicatorId("FI1"), IndicatorState.Fault, IndicatorState.None), 3)
            .Concat(Enumerable.Repeat(new IndicatorObservation(new IndicatorId("FI1"), IndicatorState.Fault, IndicatorState.Fault), 7));
        var learned = IndicatorReliabilityLearning.Learn(TestGrids.Brackenfold(), observations);
        var text = new StringWriter();

        CsvExport.WriteIndicatorStatistics(learned, text);

        var rows = CsvText.Read(text.ToString());
        Assert.Equal(CsvExport.IndicatorColumns, rows[0]);
        Assert.Equal(["FI1", "FI2", "FI3", "FI4"], rows.Skip(1).Select(r => r[0]));
        var fi1 = rows[1];
        Assert.Equal(["false", "true", "10", "3"], fi1[1..5]);
        // Beta(4.3333, 15.6667): mean 4.3333/20 = 0.216667 (see the learning tests).
        Assert.Equal(0.21666666666667, double.Parse(fi1[5], CultureInfo.InvariantCulture), 1e-12);
        var lower = double.Parse(fi1[6], CultureInfo.InvariantCulture);
        var upper = double.Parse(fi1[7], CultureInfo.InvariantCulture);
        Assert.True(lower < 0.21666 && 0.21667 < upper, $"interval {lower}..{upper} must hold the mean");
        Assert.Equal(["0", "0"], fi1[8..10]);
        // No false-report trial: the remote kind's prior rate, 0.02.
        Assert.Equal(0.02, double.Parse(fi1[10], CultureInfo.InvariantCulture), 1e-12);
    }
}
