//! Input and output files: `-` for the standard streams, an output file
//! written atomically (a temporary file in the same folder, renamed when
//! complete, with the mode and owner of the file it replaces), a symbolic
//! link followed to the file it names, a pipe or a device written straight
//! into, and never the input file.

use super::SheetError;
use std::fs::{File, OpenOptions};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};
use std::sync::{Mutex, MutexGuard};

/// Where a sheet is read from.
///
/// ```
/// use travertine::sheet::Source;
/// assert_eq!(Source::from_arg("-"), Source::Stdin);
/// assert!(matches!(Source::from_arg("field.csv"), Source::Path(_)));
/// ```
#[derive(Debug, Clone, PartialEq, Eq)]
#[non_exhaustive]
pub enum Source {
    /// Standard input.
    Stdin,
    /// A file.
    Path(PathBuf),
}

impl Source {
    /// `-` is standard input; anything else a file.
    ///
    /// ```
    /// # use travertine::sheet::Source;
    /// assert_eq!(Source::from_arg("a.csv"), Source::Path("a.csv".into()));
    /// ```
    pub fn from_arg(arg: &str) -> Source {
        if arg == "-" {
            Source::Stdin
        } else {
            Source::Path(PathBuf::from(arg))
        }
    }

    /// The name used in messages.
    pub(crate) fn describe(&self) -> String {
        match self {
            Source::Stdin => "standard input".into(),
            Source::Path(p) => p.display().to_string(),
        }
    }
}

/// Where the results are written.
///
/// ```
/// use travertine::sheet::Sink;
/// assert_eq!(Sink::from_arg(None), Sink::Stdout);
/// assert_eq!(Sink::from_arg(Some("-")), Sink::Stdout);
/// assert_eq!(Sink::from_arg(Some("out.csv")), Sink::Path("out.csv".into()));
/// ```
#[derive(Debug, Clone, PartialEq, Eq)]
#[non_exhaustive]
pub enum Sink {
    /// Standard output.
    Stdout,
    /// A file, replaced atomically when the sheet is complete (a link is
    /// followed; a pipe or a device is written straight into).
    Path(PathBuf),
}

impl Sink {
    /// No argument or `-` is standard output; anything else a file.
    ///
    /// ```
    /// # use travertine::sheet::Sink;
    /// assert!(matches!(Sink::from_arg(Some("r.csv")), Sink::Path(_)));
    /// ```
    pub fn from_arg(arg: Option<&str>) -> Sink {
        match arg {
            None | Some("-") => Sink::Stdout,
            Some(p) => Sink::Path(PathBuf::from(p)),
        }
    }
}

/// Whether two paths name the same existing file.
pub(crate) fn same_file(a: &Path, b: &Path) -> bool {
    let (Ok(ma), Ok(mb)) = (std::fs::metadata(a), std::fs::metadata(b)) else {
        return false;
    };
    #[cfg(unix)]
    {
        use std::os::unix::fs::MetadataExt;
        ma.dev() == mb.dev() && ma.ino() == mb.ino()
    }
    #[cfg(not(unix))]
    {
        let _ = (ma, mb);
        match (a.canonicalize(), b.canonicalize()) {
            (Ok(x), Ok(y)) => x == y,
            _ => false,
        }
    }
}

/// Symbolic links followed at most, as the kernel does (`ELOOP`).
const MAX_LINKS: usize = 40;

/// The file a path names once every symbolic link at its end is followed,
/// whether it exists or not: the same path when it is not a link, the
/// target of a dangling link (to be created). Links in the folders of the
/// path are left to the system.
pub(crate) fn follow_links(path: &Path) -> std::io::Result<PathBuf> {
    let mut path = path.to_path_buf();
    for _ in 0..MAX_LINKS {
        match std::fs::symlink_metadata(&path) {
            Ok(m) if m.file_type().is_symlink() => {
                let target = std::fs::read_link(&path)?;
                path = match path.parent() {
                    Some(dir) if target.is_relative() => dir.join(target),
                    _ => target,
                };
            }
            Ok(_) => return Ok(path),
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => return Ok(path),
            Err(e) => return Err(e),
        }
    }
    Err(std::io::Error::other(format!(
        "more than {MAX_LINKS} symbolic links in a row (a loop?)"
    )))
}

/// What an existing output path is, once links are followed.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Target {
    /// Nothing yet, or a regular file: written beside it and renamed.
    File,
    /// A pipe or a device: written straight into, never replaced.
    Stream,
}

/// Whether `path` (links followed) is written through a temporary file or
/// straight into.
///
/// # Errors
/// [`SheetError::Output`] for a folder or a socket, which cannot take the
/// results.
pub(crate) fn target_kind(path: &Path) -> Result<Target, SheetError> {
    let fail = |why: &str| SheetError::Output {
        path: path.to_path_buf(),
        source: std::io::Error::other(why.to_string()),
    };
    let Ok(meta) = std::fs::metadata(path) else {
        return Ok(Target::File);
    };
    let kind = meta.file_type();
    if kind.is_dir() {
        return Err(fail("it is a folder, not a file"));
    }
    if kind.is_file() {
        return Ok(Target::File);
    }
    #[cfg(unix)]
    {
        use std::os::unix::fs::FileTypeExt;
        if kind.is_socket() {
            return Err(fail(
                "it is a socket, which cannot be opened as a file; write to standard output \
                 and send that to the socket instead",
            ));
        }
    }
    Ok(Target::Stream)
}

/// The temporary files being written now, removed by
/// [`remove_unfinished_outputs`].
struct Live {
    paths: Vec<PathBuf>,
    /// [`remove_unfinished_outputs`] was called: the program is stopping,
    /// and no new temporary file may be made.
    stopped: bool,
}

static LIVE: Mutex<Live> = Mutex::new(Live {
    paths: Vec::new(),
    stopped: false,
});

/// The list of live temporary files. A panic elsewhere while it was held
/// does not make it unusable: the list itself is always whole.
fn live() -> MutexGuard<'static, Live> {
    LIVE.lock()
        .unwrap_or_else(std::sync::PoisonError::into_inner)
}

/// Removes the temporary file of every output file still being written by
/// [`run`](super::run) or [`process_to`](super::process_to) in this
/// process, and returns how many were removed. A program calls it when it
/// is told to stop (Ctrl-C, `SIGTERM`, `SIGHUP`) and is about to exit
/// without finishing, so that no hidden half-written file is left beside
/// the output; the output itself is untouched (its earlier contents, if
/// any, stay as they were).
///
/// It is for a program about to exit: from then on, an output file that
/// is still being written cannot be completed and a new one cannot be
/// started ([`SheetError::Output`]). Call it from an ordinary thread, not
/// from inside a signal handler (it takes a lock and removes files).
///
/// ```
/// // Nothing is being written here, so nothing is removed.
/// assert_eq!(travertine::sheet::remove_unfinished_outputs(), 0);
/// ```
pub fn remove_unfinished_outputs() -> usize {
    let mut live = live();
    live.stopped = true;
    let mut removed = 0;
    for path in live.paths.drain(..) {
        if std::fs::remove_file(&path).is_ok() {
            removed += 1;
        }
    }
    removed
}

/// Why an output cannot be started or completed once the program stops.
fn stopping() -> std::io::Error {
    std::io::Error::other("the program was stopped before the output was complete")
}

/// A temporary file beside the output, removed unless it is persisted.
pub(crate) struct TempFile {
    path: PathBuf,
    /// The file it will replace (links followed).
    target: PathBuf,
    /// The output as the user named it, for messages.
    shown: PathBuf,
    file: Option<File>,
    persisted: bool,
}

static COUNTER: AtomicU64 = AtomicU64::new(0);

impl TempFile {
    /// Creates `.NAME.travertine-PID-N.tmp` in the folder of `target` (a
    /// path with no link at its end), with the permissions and, where
    /// allowed, the owner of an existing `target`. `shown` is the output as
    /// the user named it.
    pub(crate) fn create(target: &Path, shown: &Path) -> Result<TempFile, SheetError> {
        let fail = |source| SheetError::Output {
            path: shown.to_path_buf(),
            source,
        };
        if target.is_dir() {
            return Err(fail(std::io::Error::other("it is a folder, not a file")));
        }
        let name = target
            .file_name()
            .ok_or_else(|| fail(std::io::Error::other("the path names no file")))?
            .to_string_lossy()
            .into_owned();
        let dir = match target.parent() {
            Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
            _ => PathBuf::from("."),
        };
        let existing = std::fs::metadata(target).ok().filter(|m| m.is_file());
        loop {
            let n = COUNTER.fetch_add(1, Ordering::Relaxed);
            let path = dir.join(format!(".{name}.travertine-{}-{n}.tmp", std::process::id()));
            // Made and listed under the lock, so that a stop at any moment
            // either comes first (and no file is made) or finds it listed.
            let mut live = live();
            if live.stopped {
                return Err(fail(stopping()));
            }
            match OpenOptions::new().write(true).create_new(true).open(&path) {
                Ok(file) => {
                    live.paths.push(path.clone());
                    drop(live);
                    let temp = TempFile {
                        path,
                        target: target.to_path_buf(),
                        shown: shown.to_path_buf(),
                        file: Some(file),
                        persisted: false,
                    };
                    if let (Some(meta), Some(file)) = (&existing, &temp.file) {
                        keep_owner_and_mode(file, meta).map_err(fail)?;
                    }
                    return Ok(temp);
                }
                Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => continue,
                Err(e) => return Err(fail(e)),
            }
        }
    }

    /// The open file, to write to.
    pub(crate) fn take_file(&mut self) -> Option<File> {
        self.file.take()
    }

    /// Makes the written file the output: flushes it to disk and renames it.
    pub(crate) fn persist(mut self, file: File) -> Result<(), SheetError> {
        let fail = |source| SheetError::Output {
            path: self.shown.clone(),
            source,
        };
        file.sync_all().map_err(fail)?;
        drop(file);
        // Under the lock, so that a stop either finds the temporary file
        // listed and removes it, or finds the output complete.
        let mut live = live();
        let Some(i) = live.paths.iter().position(|p| *p == self.path) else {
            return Err(fail(stopping()));
        };
        std::fs::rename(&self.path, &self.target).map_err(fail)?;
        live.paths.swap_remove(i);
        self.persisted = true;
        Ok(())
    }
}

/// Gives a new file the owner and permissions of the file it will replace.
/// The owner is kept where the system allows it (changing it needs
/// privileges a user usually lacks; the new file is then the user's own).
#[cfg(unix)]
fn keep_owner_and_mode(file: &File, old: &std::fs::Metadata) -> std::io::Result<()> {
    use std::os::unix::fs::MetadataExt;
    // The owner first: changing it can clear the set-id bits the mode
    // restores.
    let _ = std::os::unix::fs::fchown(file, Some(old.uid()), Some(old.gid()));
    file.set_permissions(old.permissions())
}

#[cfg(not(unix))]
fn keep_owner_and_mode(file: &File, old: &std::fs::Metadata) -> std::io::Result<()> {
    file.set_permissions(old.permissions())
}

impl Drop for TempFile {
    fn drop(&mut self) {
        self.file.take();
        if !self.persisted {
            let mut live = live();
            if let Some(i) = live.paths.iter().position(|p| *p == self.path) {
                live.paths.swap_remove(i);
                let _ = std::fs::remove_file(&self.path);
            }
        }
    }
}
