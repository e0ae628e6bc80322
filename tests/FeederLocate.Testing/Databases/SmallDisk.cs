using System.Diagnostics;

namespace FeederLocate.Testing;

/// <summary>
/// A 1 MB tmpfs mounted on a fresh folder, for filling the disk under a database; unmounted on dispose.
/// <see cref="TryMount"/> gives null where mounting is not allowed (not root, in a container without the
/// capability): the tests then fill the database by SQLite's own page limit instead.
/// </summary>
public sealed class SmallDisk : IDisposable
{
    private SmallDisk(string folder) => Folder = folder;

    public string Folder { get; }

    public string Path(string name) => System.IO.Path.Combine(Folder, name);

    public static SmallDisk? TryMount()
    {
        if (!OperatingSystem.IsLinux())
        {
            return null;
        }

        var folder = Directory.CreateTempSubdirectory("feederlocate-small-disk-").FullName;
        if (Run("mount", "-t", "tmpfs", "-o", "size=1m", "tmpfs", folder) == 0)
        {
            return new SmallDisk(folder);
        }

        Directory.Delete(folder);
        return null;
    }

    /// <summary>Writes a filler file until the disk is full; returns it, so a test can free the space again.</summary>
    public string Fill()
    {
        var filler = Path("filler");
        using var stream = new FileStream(filler, FileMode.Create, FileAccess.Write);
        var block = new byte[4096];
        try
        {
            while (true)
            {
                stream.Write(block);
                stream.Flush();
            }
        }
        catch (IOException)
        {
            // No space left on device: the point.
        }

        return filler;
    }

    public void Dispose()
    {
        Run("umount", "-l", Folder);
        Directory.Delete(Folder, recursive: true);
    }

    private static int Run(string program, params string[] arguments)
    {
        try
        {
            var info = new ProcessStartInfo(program) { RedirectStandardError = true, RedirectStandardOutput = true };
            foreach (var argument in arguments)
            {
                info.ArgumentList.Add(argument);
            }

            using var process = Process.Start(info)!;
            process.WaitForExit();
            return process.ExitCode;
        }
        catch (System.ComponentModel.Win32Exception)
        {
            return -1;
        }
    }
}
