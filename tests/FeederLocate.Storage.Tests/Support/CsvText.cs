using System.Text;

namespace FeederLocate.Storage.Tests.Support;

/// <summary>A small RFC 4180 reader, independent of the exporter, to read exported tables back.</summary>
public static class CsvText
{
    public static List<List<string>> Read(string text)
    {
        var records = new List<List<string>>();
        var record = new List<string>();
        var field = new StringBuilder();
        var i = 0;
        while (i < text.Length)
        {
            if (text[i] == '"' && field.Length == 0)
            {
                i++;
                while (true)
                {
                    if (i >= text.Length)
                    {
                        throw new FormatException("unterminated quoted field");
                    }

                    if (text[i] == '"')
                    {
                        if (i + 1 < text.Length && text[i + 1] == '"')
                        {
                            field.Append('"');
                            i += 2;
                            continue;
                        }

                        i++;
                        break;
                    }

                    field.Append(text[i++]);
                }
            }
            else if (text[i] == ',')
            {
                record.Add(field.ToString());
                field.Clear();
                i++;
            }
            else if (text[i] == '\r' && i + 1 < text.Length && text[i + 1] == '\n')
            {
                record.Add(field.ToString());
                field.Clear();
                records.Add(record);
                record = [];
                i += 2;
            }
            else
            {
                field.Append(text[i++]);
            }
        }

        if (field.Length > 0 || record.Count > 0)
        {
            throw new FormatException("the last record does not end with CRLF");
        }

        return records;
    }
}
