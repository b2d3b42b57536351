//! All-or-nothing output: files are written into a fresh temporary folder beside the target
//! and moved into the target only when every one of them was written, so a failed run never
//! leaves a half-written design note. The temporary folder is created before any analysis,
//! so an unwritable output path is reported before work is done.
//!
//! After a run the folder holds only that run's outputs plus the user's own files: each
//! commit also writes [`MANIFEST`], listing the files the run wrote (with length and a
//! 64-bit FNV-1a hash of each), and removes, as part of the same all-or-nothing commit, the
//! files an earlier run's manifest lists that this run does not write again (so `modes`
//! after `check` leaves no 3-mode note beside a 5-mode table). A listed file that was
//! changed since (other length or hash) has become the user's and is kept; a file that no
//! manifest lists is never touched.

use std::path::{Path, PathBuf};

use super::ReportError;

/// The file in each output folder that lists what the last run wrote there.
pub const MANIFEST: &str = ".stackwake-manifest";

/// An output folder being prepared.
#[derive(Debug)]
pub struct Staging {
    target: PathBuf,
    tmp: PathBuf,
    files: Vec<String>,
    /// Length and FNV-1a hash of each staged file, for the manifest.
    stamps: Vec<Stamp>,
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
            stamps: Vec::new(),
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
        self.stamps.push(Stamp::of(bytes));
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
    /// restored, so the folder is left as it was. The new [`MANIFEST`] moves in with the
    /// files, and the earlier run's files that this run does not write again are moved aside
    /// last (and put back if that fails); they are deleted with the temporary folder.
    /// Returns the run's files (not the manifest).
    pub fn commit(mut self) -> Result<Vec<PathBuf>, ReportError> {
        std::fs::create_dir_all(&self.target).map_err(|e| io_error(&self.target, e))?;
        let manifest = manifest_text(&self.files, &self.stamps);
        std::fs::write(self.tmp.join(MANIFEST), manifest.as_bytes())
            .map_err(|e| io_error(&self.target.join(MANIFEST), e))?;
        let mut names = self.files.clone();
        names.push(MANIFEST.to_string());
        for name in &names {
            check_destination(&self.target.join(name))?;
        }
        let obsolete = self.obsolete_files();
        let mut moved: Vec<Moved> = Vec::new();
        let mut failure = None;
        for name in &names {
            let dest = self.target.join(name);
            match self.move_in(name, &dest) {
                Ok(m) => moved.push(m),
                Err(source) => {
                    failure = Some((dest, source));
                    break;
                }
            }
        }
        if failure.is_none() {
            failure = self.move_aside(&obsolete, &mut moved).err();
        }
        if let Some((dest, source)) = failure {
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
        self.committed = true;
        let _ = std::fs::remove_dir_all(&self.tmp);
        Ok(moved
            .into_iter()
            .filter(|m| m.new_file && !m.dest.ends_with(MANIFEST))
            .map(|m| m.dest)
            .collect())
    }

    /// Files the earlier run's manifest lists, that this run does not write, and that are
    /// still exactly as that run wrote them.
    fn obsolete_files(&self) -> Vec<String> {
        let Ok(text) = std::fs::read_to_string(self.target.join(MANIFEST)) else {
            return Vec::new();
        };
        parse_manifest(&text)
            .into_iter()
            .filter(|(name, _)| !self.files.contains(name))
            .filter(|(name, stamp)| {
                let path = self.target.join(name);
                let plain = std::fs::symlink_metadata(&path).is_ok_and(|m| m.is_file());
                plain && std::fs::read(&path).is_ok_and(|b| Stamp::of(&b) == *stamp)
            })
            .map(|(name, _)| name)
            .collect()
    }

    /// Moves the earlier run's obsolete files into the temporary folder (recorded in
    /// `moved` so that a roll-back puts them back).
    fn move_aside(
        &self,
        obsolete: &[String],
        moved: &mut Vec<Moved>,
    ) -> Result<(), (PathBuf, std::io::Error)> {
        if obsolete.is_empty() {
            return Ok(());
        }
        let aside = self.tmp.join(OBSOLETE_FOLDER);
        std::fs::create_dir(&aside).map_err(|e| (aside.clone(), e))?;
        for name in obsolete {
            let dest = self.target.join(name);
            let backup = aside.join(name);
            std::fs::rename(&dest, &backup).map_err(|e| (dest.clone(), e))?;
            moved.push(Moved {
                dest,
                backup: Some(backup),
                new_file: false,
            });
        }
        Ok(())
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
            new_file: true,
        })
    }

    /// Undoes the moves done so far, newest first.
    fn roll_back(&self, moved: &mut Vec<Moved>) -> Result<(), ReportError> {
        while let Some(m) = moved.pop() {
            let undone = match (&m.backup, m.new_file) {
                (Some(b), _) => std::fs::rename(b, &m.dest),
                (None, true) => std::fs::remove_file(&m.dest),
                (None, false) => Ok(()),
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

/// Folder inside the temporary folder that holds an earlier run's obsolete files during a
/// commit (a name no staged file has: staged names are plain output names).
const OBSOLETE_FOLDER: &str = "obsolete-outputs.d";

/// A file moved into the target folder, with the original it replaced (if any); or, with
/// `new_file` false, an earlier run's file moved out of it into `backup`.
#[derive(Debug)]
struct Moved {
    dest: PathBuf,
    backup: Option<PathBuf>,
    new_file: bool,
}

/// Length and 64-bit FNV-1a hash of a file's bytes: enough to tell whether a file is still
/// the one a run wrote (this is a guard against deleting a user's edit, not a security
/// check).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
struct Stamp {
    len: u64,
    fnv1a: u64,
}

impl Stamp {
    fn of(bytes: &[u8]) -> Stamp {
        // FNV-1a, 64-bit offset basis and prime (Fowler, Noll, Vo; common practice).
        let mut h: u64 = 0xcbf2_9ce4_8422_2325;
        for &b in bytes {
            h ^= u64::from(b);
            h = h.wrapping_mul(0x0000_0100_0000_01b3);
        }
        Stamp {
            len: bytes.len() as u64,
            fnv1a: h,
        }
    }
}

/// The manifest: a comment header, then `HASH LENGTH NAME` per file.
fn manifest_text(files: &[String], stamps: &[Stamp]) -> String {
    let mut s = String::from(
        "# Files the last stackwake run wrote into this folder (FNV-1a hash, length, name).\n\
         # The next run into this folder removes those it does not write again, unless they\n\
         # were changed since; files not listed here are never touched.\n",
    );
    for (name, st) in files.iter().zip(stamps) {
        s.push_str(&format!("{:016x} {} {name}\n", st.fnv1a, st.len));
    }
    s
}

/// The entries of a manifest. Lines that are not exactly what [`manifest_text`] writes,
/// or that name anything but a plain file name in the folder, are ignored: a damaged or
/// hand-edited manifest can only make a run remove less.
fn parse_manifest(text: &str) -> Vec<(String, Stamp)> {
    text.lines()
        .filter(|l| !l.starts_with('#'))
        .filter_map(|l| {
            let mut parts = l.splitn(3, ' ');
            let hash = u64::from_str_radix(parts.next()?, 16).ok()?;
            let len = parts.next()?.parse().ok()?;
            let name = parts.next()?;
            let plain = !name.is_empty()
                && name != "."
                && name != ".."
                && name != MANIFEST
                && !name.contains(['/', '\\'])
                && !name.chars().any(char::is_control);
            plain.then(|| (name.to_string(), Stamp { len, fnv1a: hash }))
        })
        .collect()
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

    fn commit(target: &Path, files: &[(&str, &[u8])]) -> Vec<PathBuf> {
        let mut s = Staging::begin(target).unwrap();
        for (name, bytes) in files {
            s.write(name, bytes).unwrap();
        }
        s.commit().unwrap()
    }

    #[test]
    fn an_earlier_runs_files_go_and_the_users_stay() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("out");
        commit(
            &target,
            &[("a.csv", b"1"), ("note.html", b"old"), ("b.csv", b"2")],
        );
        std::fs::write(target.join("mine.txt"), b"user").unwrap();
        // The user edited b.csv: it is theirs now.
        std::fs::write(target.join("b.csv"), b"2, checked").unwrap();
        let files = commit(&target, &[("a.csv", b"10")]);
        assert_eq!(files, vec![target.join("a.csv")]);
        let mut names: Vec<String> = std::fs::read_dir(&target)
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        names.sort();
        assert_eq!(names, [MANIFEST, "a.csv", "b.csv", "mine.txt"]);
        assert_eq!(std::fs::read(target.join("a.csv")).unwrap(), b"10");
        let m = std::fs::read_to_string(target.join(MANIFEST)).unwrap();
        assert_eq!(
            parse_manifest(&m),
            vec![("a.csv".to_string(), Stamp::of(b"10"))]
        );
        assert_eq!(std::fs::read_dir(dir.path()).unwrap().count(), 1);
    }

    #[test]
    fn a_failed_commit_keeps_the_earlier_runs_files() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("out");
        commit(&target, &[("a.csv", b"1"), ("note.html", b"old")]);
        let manifest = std::fs::read(target.join(MANIFEST)).unwrap();
        // A folder where the new run's file must go stops the commit.
        std::fs::create_dir(target.join("c.csv")).unwrap();
        let mut s = Staging::begin(&target).unwrap();
        s.write("a.csv", b"2").unwrap();
        s.write("c.csv", b"3").unwrap();
        assert!(s.commit().is_err());
        assert_eq!(std::fs::read(target.join("a.csv")).unwrap(), b"1");
        assert_eq!(std::fs::read(target.join("note.html")).unwrap(), b"old");
        assert_eq!(std::fs::read(target.join(MANIFEST)).unwrap(), manifest);
    }

    #[test]
    fn a_damaged_manifest_removes_nothing_outside_the_folder() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("out");
        std::fs::create_dir(&target).unwrap();
        std::fs::write(dir.path().join("precious"), b"p").unwrap();
        let st = Stamp::of(b"p");
        let text = format!(
            "{:016x} {} ../precious\n{:016x} {} {MANIFEST}\nnot a line\n",
            st.fnv1a, st.len, st.fnv1a, st.len
        );
        std::fs::write(target.join(MANIFEST), text).unwrap();
        assert!(
            parse_manifest(&std::fs::read_to_string(target.join(MANIFEST)).unwrap()).is_empty()
        );
        commit(&target, &[("a.csv", b"1")]);
        assert_eq!(std::fs::read(dir.path().join("precious")).unwrap(), b"p");
    }
}
