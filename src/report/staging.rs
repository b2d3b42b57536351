//! All-or-nothing output: files are written into a fresh temporary folder beside the target
//! and moved into the target only when every one of them was written, so a failed run never
//! leaves a half-written design note. The temporary folder is created before any analysis,
//! so an unwritable output path is reported before work is done.

use std::path::{Path, PathBuf};

use super::ReportError;

/// An output folder being prepared.
#[derive(Debug)]
pub struct Staging {
    target: PathBuf,
    tmp: PathBuf,
    files: Vec<String>,
    committed: bool,
}

fn io_error(path: &Path, source: std::io::Error) -> ReportError {
    ReportError::Write {
        path: path.to_path_buf(),
        source,
    }
}

impl Staging {
    /// Prepares to write into `target` (created if missing on commit).
    pub fn begin(target: &Path) -> Result<Staging, ReportError> {
        if target.exists() && !target.is_dir() {
            return Err(ReportError::NotAFolder {
                path: target.to_path_buf(),
            });
        }
        let parent = match target.parent() {
            Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
            _ => PathBuf::from("."),
        };
        std::fs::create_dir_all(&parent).map_err(|e| ReportError::CannotCreate {
            path: target.to_path_buf(),
            reason: blocking_ancestor(&parent)
                .map(|a| format!("{} is a file, not a folder", a.display()))
                .unwrap_or_else(|| e.to_string()),
        })?;
        let name = target
            .file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_else(|| "out".into());
        let tmp = parent.join(format!(".{name}.partial-{}", std::process::id()));
        if tmp.exists() {
            std::fs::remove_dir_all(&tmp).map_err(|e| io_error(&tmp, e))?;
        }
        std::fs::create_dir(&tmp).map_err(|e| io_error(target, e))?;
        Ok(Staging {
            target: target.to_path_buf(),
            tmp,
            files: Vec::new(),
            committed: false,
        })
    }

    /// The final folder.
    pub fn target(&self) -> &Path {
        &self.target
    }

    /// Stages one file (a plain name, no folders).
    pub fn write(&mut self, name: &str, bytes: &[u8]) -> Result<(), ReportError> {
        let path = self.tmp.join(name);
        std::fs::write(&path, bytes).map_err(|e| io_error(&self.target.join(name), e))?;
        self.files.push(name.to_string());
        Ok(())
    }

    /// Checks, before any analysis, that each of `names` could be replaced in the target
    /// folder, so a blocked output file is reported before work is done. [`Staging::commit`]
    /// checks again.
    pub fn check_destinations(&self, names: &[&str]) -> Result<(), ReportError> {
        names
            .iter()
            .try_for_each(|name| check_destination(&self.target.join(name)))
    }

    /// Moves every staged file into the target folder, all or nothing: every destination is
    /// checked first; a file being replaced is first moved aside into the temporary folder,
    /// and if any move fails, the files already moved are taken back out and the originals
    /// restored, so the folder is left as it was.
    pub fn commit(mut self) -> Result<Vec<PathBuf>, ReportError> {
        std::fs::create_dir_all(&self.target).map_err(|e| io_error(&self.target, e))?;
        for name in &self.files {
            check_destination(&self.target.join(name))?;
        }
        let mut moved: Vec<Moved> = Vec::new();
        for name in &self.files {
            let dest = self.target.join(name);
            match self.move_in(name, &dest) {
                Ok(m) => moved.push(m),
                Err(source) => {
                    if let Err(stuck) = self.roll_back(&mut moved) {
                        // Keep the temporary folder: it holds the originals not put back.
                        self.committed = true;
                        return Err(ReportError::RollbackFailed {
                            path: dest,
                            backup: self.tmp.clone(),
                            message: format!("{source}; then {stuck}"),
                        });
                    }
                    return Err(ReportError::Unchanged { path: dest, source });
                }
            }
        }
        self.committed = true;
        let _ = std::fs::remove_dir_all(&self.tmp);
        Ok(moved.into_iter().map(|m| m.dest).collect())
    }

    /// Moves one staged file to `dest`, first moving an existing `dest` aside.
    fn move_in(&self, name: &str, dest: &Path) -> Result<Moved, std::io::Error> {
        let backup = if std::fs::symlink_metadata(dest).is_ok() {
            let backup = self.tmp.join(format!("{name}{BACKUP_SUFFIX}"));
            std::fs::rename(dest, &backup)?;
            Some(backup)
        } else {
            None
        };
        if let Err(e) = std::fs::rename(self.tmp.join(name), dest) {
            if let Some(b) = &backup {
                let _ = std::fs::rename(b, dest);
            }
            return Err(e);
        }
        Ok(Moved {
            dest: dest.to_path_buf(),
            backup,
        })
    }

    /// Undoes the moves done so far, newest first.
    fn roll_back(&self, moved: &mut Vec<Moved>) -> Result<(), ReportError> {
        while let Some(m) = moved.pop() {
            let undone = match &m.backup {
                Some(b) => std::fs::rename(b, &m.dest),
                None => std::fs::remove_file(&m.dest),
            };
            undone.map_err(|e| io_error(&m.dest, e))?;
        }
        Ok(())
    }
}

/// The nearest existing ancestor of `path` (or `path` itself) when it is not a folder.
fn blocking_ancestor(path: &Path) -> Option<PathBuf> {
    path.ancestors()
        .find(|a| std::fs::symlink_metadata(a).is_ok())
        .filter(|a| !a.is_dir())
        .map(Path::to_path_buf)
}

/// Suffix of an original output file kept in the temporary folder during a commit.
const BACKUP_SUFFIX: &str = ".previous";

/// A file moved into the target folder, with the original it replaced (if any).
#[derive(Debug)]
struct Moved {
    dest: PathBuf,
    backup: Option<PathBuf>,
}

/// Whether a file could be put at `dest`: absent, or a replaceable plain file. Root ignores
/// permission bits, so the read-only test only helps other users; a folder (or anything not
/// a plain file) in the way stops everyone.
fn check_destination(dest: &Path) -> Result<(), ReportError> {
    let Ok(meta) = std::fs::symlink_metadata(dest) else {
        return Ok(());
    };
    if !meta.is_file() {
        return Err(ReportError::Blocked {
            path: dest.to_path_buf(),
        });
    }
    if meta.permissions().readonly() {
        return Err(ReportError::ReadOnly {
            path: dest.to_path_buf(),
        });
    }
    Ok(())
}

impl Drop for Staging {
    fn drop(&mut self) {
        if !self.committed {
            let _ = std::fs::remove_dir_all(&self.tmp);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn nothing_reaches_the_target_without_commit() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("out");
        {
            let mut s = Staging::begin(&target).unwrap();
            s.write("a.csv", b"x").unwrap();
        }
        assert!(!target.exists());
        let mut s = Staging::begin(&target).unwrap();
        s.write("a.csv", b"x").unwrap();
        s.commit().unwrap();
        assert_eq!(std::fs::read(target.join("a.csv")).unwrap(), b"x");
        // No temporary folders left behind.
        assert_eq!(std::fs::read_dir(dir.path()).unwrap().count(), 1);
    }
}
