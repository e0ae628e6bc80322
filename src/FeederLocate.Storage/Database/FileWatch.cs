using FeederLocate.Storage.Errors;

namespace FeederLocate.Storage.Database;

/// <summary>
/// Remembers which file the database path named when it was opened and, before every write, checks that the
/// path still names it. Once the file is found gone, every later write is refused too, even if a file of the
/// same name reappears (it is not the one this program was writing).
/// </summary>
internal sealed class FileWatch
{
    private readonly string _path;
    private readonly FileIdentity _opened;
    private string? _gone;

    public FileWatch(string path)
    {
        _path = path;
        _opened = FileIdentity.Of(path);
    }

    /// <summary>Throws <see cref="DatabaseFileGoneException"/> when the file was deleted or replaced since opening.</summary>
    public void EnsureUnchanged()
    {
        if (_gone is null && _opened.Exists)
        {
            var now = FileIdentity.Of(_path);
            if (!now.Exists)
            {
                _gone = "was deleted";
            }
            else if (now != _opened)
            {
                _gone = "was replaced by another file";
            }
        }

        if (_gone is not null)
        {
            throw new DatabaseFileGoneException(_path, _gone);
        }
    }
}
