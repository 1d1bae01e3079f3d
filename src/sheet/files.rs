//! Input and output files: `-` for the standard streams, an output file
//! written atomically (a temporary file in the same folder, renamed when
//! complete), and never the input file.

use super::SheetError;
use std::fs::{File, OpenOptions};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};

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
    /// A file, replaced atomically when the sheet is complete.
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

/// A temporary file beside the output, removed unless it is persisted.
pub(crate) struct TempFile {
    path: PathBuf,
    target: PathBuf,
    file: Option<File>,
    persisted: bool,
}

static COUNTER: AtomicU64 = AtomicU64::new(0);

impl TempFile {
    /// Creates `.NAME.travertine-PID-N.tmp` in the folder of `target`.
    pub(crate) fn create(target: &Path) -> Result<TempFile, SheetError> {
        let fail = |source| SheetError::Output {
            path: target.to_path_buf(),
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
        loop {
            let n = COUNTER.fetch_add(1, Ordering::Relaxed);
            let path = dir.join(format!(".{name}.travertine-{}-{n}.tmp", std::process::id()));
            match OpenOptions::new().write(true).create_new(true).open(&path) {
                Ok(file) => {
                    return Ok(TempFile {
                        path,
                        target: target.to_path_buf(),
                        file: Some(file),
                        persisted: false,
                    })
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
            path: self.target.clone(),
            source,
        };
        file.sync_all().map_err(fail)?;
        drop(file);
        std::fs::rename(&self.path, &self.target).map_err(fail)?;
        self.persisted = true;
        Ok(())
    }
}

impl Drop for TempFile {
    fn drop(&mut self) {
        self.file.take();
        if !self.persisted {
            let _ = std::fs::remove_file(&self.path);
        }
    }
}
