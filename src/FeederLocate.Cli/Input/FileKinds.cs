using System.Buffers.Binary;
using System.Runtime.InteropServices;

namespace FeederLocate.Cli.Input;

/// <summary>Whether a path names a regular file, read with <c>stat(2)</c> (devices, pipes and sockets are not).</summary>
public static class FileKinds
{
    private const uint TypeMask = 0xF000; // S_IFMT
    private const uint Regular = 0x8000;  // S_IFREG

    /// <summary>True when something other than a regular file or a directory is at <paramref name="path"/> (a device, a pipe).</summary>
    public static bool IsSpecial(string path)
    {
        if (!File.Exists(path) || !OperatingSystem.IsLinux())
        {
            return false;
        }

        // glibc's struct stat: st_mode follows st_dev, st_ino and st_nlink (8 bytes each) on x86-64, and st_dev and st_ino on AArch64.
        var modeOffset = RuntimeInformation.ProcessArchitecture switch
        {
            Architecture.X64 => 24,
            Architecture.Arm64 => 16,
            _ => -1,
        };
        if (modeOffset < 0)
        {
            return false;
        }

        var buffer = new byte[256];
        try
        {
            if (NativeMethods.Stat(path, buffer) != 0)
            {
                return false;
            }
        }
        catch (EntryPointNotFoundException)
        {
            return false;
        }

        return (BinaryPrimitives.ReadUInt32LittleEndian(buffer.AsSpan(modeOffset)) & TypeMask) != Regular;
    }

    private static class NativeMethods
    {
        [DllImport("libc", EntryPoint = "stat", SetLastError = true, CharSet = CharSet.Ansi, BestFitMapping = false, ThrowOnUnmappableChar = true)]
        [DefaultDllImportSearchPaths(DllImportSearchPath.SafeDirectories)]
        public static extern int Stat(string path, byte[] buffer);
    }
}
