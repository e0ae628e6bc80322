using System.Buffers.Binary;
using System.Runtime.InteropServices;

namespace FeederLocate.Storage.Database;

/// <summary>
/// Which file a path names: its device and inode on Linux, read with <c>stat(2)</c>. A file deleted, or replaced
/// by another one renamed over it, has a different identity (or none) even if a file of the same name exists.
/// Elsewhere only whether the path exists is known.
/// </summary>
internal readonly record struct FileIdentity(bool Exists, ulong Device, ulong Inode)
{
    // glibc's struct stat on x86-64 and on AArch64 both start with st_dev and st_ino, 8 bytes each.
    private const int StatBufferBytes = 256;

    public static FileIdentity Of(string path)
    {
        if (!File.Exists(path))
        {
            return new FileIdentity(false, 0, 0);
        }

        if (!OperatingSystem.IsLinux() || RuntimeInformation.ProcessArchitecture is not (Architecture.X64 or Architecture.Arm64))
        {
            return new FileIdentity(true, 0, 0);
        }

        var buffer = new byte[StatBufferBytes];
        try
        {
            if (NativeMethods.Stat(path, buffer) != 0)
            {
                return new FileIdentity(false, 0, 0);
            }
        }
        catch (EntryPointNotFoundException)
        {
            return new FileIdentity(true, 0, 0);
        }

        return new FileIdentity(true, BinaryPrimitives.ReadUInt64LittleEndian(buffer), BinaryPrimitives.ReadUInt64LittleEndian(buffer.AsSpan(8)));
    }

    private static class NativeMethods
    {
        [DllImport("libc", EntryPoint = "stat", SetLastError = true, CharSet = CharSet.Ansi, BestFitMapping = false, ThrowOnUnmappableChar = true)]
        [DefaultDllImportSearchPaths(DllImportSearchPath.SafeDirectories)]
        public static extern int Stat(string path, byte[] buffer);
    }
}
