//! Finding input files, reading them, and writing them back atomically.

use std::fs;
use std::io::{self, Read, Write};
use std::path::{Path, PathBuf};

/// An input named on the command line, after directory expansion.
pub enum Input {
    Stdin,
    File(PathBuf),
}

impl Input {
    /// The input a command-line path names: `-` is standard input.
    pub fn from_path(path: &Path) -> Input {
        if path.as_os_str() == "-" {
            Input::Stdin
        } else {
            Input::File(path.to_path_buf())
        }
    }

    /// The name shown in messages and output.
    pub fn display(&self) -> String {
        match self {
            Input::Stdin => "<stdin>".to_string(),
            Input::File(p) => p.display().to_string(),
        }
    }
}

/// Expands `paths`: `-` is standard input, a directory gives its `*.imp`
/// files recursively (sorted), anything else is taken as a file. Problems
/// (a missing path, an unreadable directory) are returned beside the inputs
/// so the other paths are still processed.
pub fn collect(paths: &[PathBuf]) -> (Vec<Input>, Vec<String>) {
    let mut inputs = Vec::new();
    let mut problems = Vec::new();
    for p in paths {
        if p.as_os_str() == "-" {
            inputs.push(Input::from_path(p));
        } else if p.is_dir() {
            let mut found = Vec::new();
            walk(p, &mut found, &mut problems);
            found.sort();
            inputs.extend(found.into_iter().map(Input::File));
        } else if p.exists() {
            inputs.push(Input::File(p.clone()));
        } else {
            problems.push(format!("{}: no such file or directory", p.display()));
        }
    }
    (inputs, problems)
}

fn walk(dir: &Path, out: &mut Vec<PathBuf>, problems: &mut Vec<String>) {
    let entries = match fs::read_dir(dir) {
        Ok(e) => e,
        Err(e) => {
            problems.push(format!("{}: cannot read directory: {e}", dir.display()));
            return;
        }
    };
    for entry in entries.flatten() {
        let path = entry.path();
        let Ok(kind) = entry.file_type() else {
            continue;
        };
        if kind.is_dir() {
            walk(&path, out, problems);
        } else if path.extension().is_some_and(|e| e == "imp") {
            out.push(path);
        }
    }
}

/// Reads a file (or standard input for `-`) as bytes.
pub fn read_input(path: &Path) -> io::Result<Vec<u8>> {
    if path.as_os_str() == "-" {
        let mut buf = Vec::new();
        io::stdin().read_to_end(&mut buf)?;
        Ok(buf)
    } else {
        fs::read(path)
    }
}

/// Reads an [`Input`].
pub fn read(input: &Input) -> io::Result<Vec<u8>> {
    match input {
        Input::Stdin => read_input(Path::new("-")),
        Input::File(p) => fs::read(p),
    }
}

/// Reads an [`Input`], or says on standard error why it cannot be read.
pub fn read_or_report(input: &Input) -> Option<Vec<u8>> {
    match read(input) {
        Ok(b) => Some(b),
        Err(e) => {
            eprintln!("implica: {}: cannot read: {e}", input.display());
            None
        }
    }
}

/// Replaces the contents of `path` with `contents`, atomically: the text
/// goes to a temporary file in the same directory, is flushed to disk, and
/// is renamed over the original, whose permissions it keeps. If the file no
/// longer holds `expected` (someone changed it meanwhile), nothing is written.
pub fn write_atomic(path: &Path, expected: &[u8], contents: &[u8]) -> io::Result<()> {
    let perms = fs::metadata(path)?.permissions();
    write_via_temp(path, contents, Some(perms), Some(expected))
}

/// Writes `contents` to `path`, which may or may not exist, atomically as
/// [`write_atomic`] does. An existing file keeps its permissions; a new one
/// gets the usual ones (read and write as the umask allows).
pub fn write_new(path: &Path, contents: &[u8]) -> io::Result<()> {
    let perms = match fs::metadata(path) {
        Ok(m) => Some(m.permissions()),
        Err(e) if e.kind() == io::ErrorKind::NotFound => None,
        Err(e) => return Err(e),
    };
    write_via_temp(path, contents, perms, None)
}

/// A temporary file beside `path` with `contents` and `perms` (or the
/// usual permissions), flushed and renamed over `path`; when `expected` is
/// given, only if `path` still holds it.
fn write_via_temp(
    path: &Path,
    contents: &[u8],
    perms: Option<fs::Permissions>,
    expected: Option<&[u8]>,
) -> io::Result<()> {
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d,
        _ => Path::new("."),
    };
    let mut tmp = tempfile::Builder::new()
        .prefix(".implica-")
        .suffix(".tmp")
        .tempfile_in(dir)?;
    tmp.write_all(contents)?;
    tmp.as_file().sync_all()?;
    match perms {
        Some(p) => fs::set_permissions(tmp.path(), p)?,
        None => set_default_permissions(tmp.path())?,
    }
    if let Some(expected) = expected
        && fs::read(path)? != expected
    {
        return Err(io::Error::other(
            "the file changed on disk while implica was running; it was left as it is",
        ));
    }
    tmp.persist(path).map_err(|e| e.error)?;
    Ok(())
}

#[cfg(unix)]
fn set_default_permissions(path: &Path) -> io::Result<()> {
    use std::os::unix::fs::PermissionsExt;
    // SAFETY: umask only swaps the process's file-creation mask; the
    // command is single-threaded, so nothing creates a file in between.
    let mask = unsafe {
        let m = libc::umask(0o022);
        libc::umask(m);
        m
    };
    // `mode_t` is u32 on Linux but u16 on some other systems.
    #[allow(clippy::useless_conversion)]
    let mask = u32::from(mask);
    fs::set_permissions(path, fs::Permissions::from_mode(0o666 & !mask))
}

#[cfg(not(unix))]
fn set_default_permissions(_: &Path) -> io::Result<()> {
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn leftovers(dir: &Path) -> Vec<String> {
        fs::read_dir(dir)
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .filter(|n| n.starts_with(".implica-"))
            .collect()
    }

    #[test]
    fn a_file_changed_meanwhile_is_not_overwritten() {
        let dir = tempfile::tempdir().unwrap();
        let p = dir.path().join("a.imp");
        fs::write(&p, b"changed by someone else").unwrap();
        let err = write_atomic(&p, b"what we read", b"formatted").unwrap_err();
        assert!(err.to_string().contains("changed on disk"), "{err}");
        assert_eq!(fs::read(&p).unwrap(), b"changed by someone else");
        assert!(
            leftovers(dir.path()).is_empty(),
            "temporary file left behind"
        );
    }

    #[test]
    fn replaces_contents_and_keeps_permissions() {
        let dir = tempfile::tempdir().unwrap();
        let p = dir.path().join("a.imp");
        fs::write(&p, b"old").unwrap();
        #[cfg(unix)]
        {
            use std::os::unix::fs::PermissionsExt;
            fs::set_permissions(&p, fs::Permissions::from_mode(0o604)).unwrap();
        }
        write_atomic(&p, b"old", b"new").unwrap();
        assert_eq!(fs::read(&p).unwrap(), b"new");
        #[cfg(unix)]
        {
            use std::os::unix::fs::PermissionsExt;
            assert_eq!(
                fs::metadata(&p).unwrap().permissions().mode() & 0o777,
                0o604
            );
        }
        assert!(leftovers(dir.path()).is_empty());
    }

    #[test]
    fn a_missing_file_is_an_error_and_nothing_is_created() {
        let dir = tempfile::tempdir().unwrap();
        let p = dir.path().join("gone.imp");
        assert!(write_atomic(&p, b"", b"x").is_err());
        assert!(!p.exists());
        assert!(leftovers(dir.path()).is_empty());
    }
}
