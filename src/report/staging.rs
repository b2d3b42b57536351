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
        std::fs::create_dir_all(&parent).map_err(|e| io_error(&parent, e))?;
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

    /// Moves every staged file into the target folder.
    pub fn commit(mut self) -> Result<Vec<PathBuf>, ReportError> {
        std::fs::create_dir_all(&self.target).map_err(|e| io_error(&self.target, e))?;
        // Check every destination first, so a read-only file stops the commit before any
        // file is replaced.
        for name in &self.files {
            let dest = self.target.join(name);
            if let Ok(meta) = std::fs::metadata(&dest) {
                if meta.permissions().readonly() {
                    return Err(ReportError::ReadOnly { path: dest });
                }
            }
        }
        let mut written = Vec::new();
        for name in &self.files {
            let dest = self.target.join(name);
            std::fs::rename(self.tmp.join(name), &dest).map_err(|e| io_error(&dest, e))?;
            written.push(dest);
        }
        self.committed = true;
        let _ = std::fs::remove_dir_all(&self.tmp);
        Ok(written)
    }
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
