//! All-or-nothing output. Files are written into a staging folder inside the target,
//! `OUT/.stackwake-staging-PID` (inside, so that any folder the user can write to works as
//! an output folder, `~` and `/tmp` included; nothing is created beside it), and moved into
//! the target only when every one of them was written, so a failed run never leaves a
//! half-written design note. The staging folder is created before any analysis, so an
//! unwritable output path is reported before work is done.
//!
//! Runs into one folder are serialised by an advisory lock ([`lock`]) held from the
//! creation of the staging folder to the end of the commit; the second run waits. A commit
//! first writes a journal ([`journal`]); a run killed during its moves is completed by the
//! next run into the folder, and a run killed before is simply removed ([`cleanup`], which
//! also cleans up on Ctrl-C and SIGTERM). A reader that takes a shared `flock` on
//! `.stackwake-lock` (when it exists) never sees a mix of two runs.
//!
//! After a run the folder holds only that run's outputs plus the user's own files: each
//! commit also writes [`MANIFEST`], listing the files the run wrote (with length and a
//! 64-bit FNV-1a hash of each), and removes, as part of the same all-or-nothing commit, the
//! files an earlier run's manifest lists that this run does not write again (so `modes`
//! after `check` leaves no 3-mode note beside a 5-mode table). A listed file that was
//! changed since (other length or hash) has become the user's and is kept; a file that no
//! manifest lists is never touched.

pub mod cleanup;
pub mod journal;
pub mod lock;
pub mod manifest;

use std::path::{Path, PathBuf};

use super::ReportError;
pub use cleanup::clean_up_on_signals;
use cleanup::{active, Active, STAGING_PREFIX};
use journal::{Journal, BACKUP_SUFFIX, OBSOLETE_FOLDER};
use lock::FolderLock;
pub use lock::LOCK_FILE;
pub use manifest::MANIFEST;
use manifest::{manifest_text, Stamp};

/// An output folder being prepared.
#[derive(Debug)]
pub struct Staging {
    target: PathBuf,
    tmp: PathBuf,
    files: Vec<String>,
    /// Length and FNV-1a hash of each staged file, for the manifest.
    stamps: Vec<Stamp>,
    committed: bool,
    /// Held until the commit ends or the staging folder is removed.
    lock: Option<FolderLock>,
    /// Whether this run created the target (removed again if the run fails).
    created_target: bool,
}

fn io_error(path: &Path, source: std::io::Error) -> ReportError {
    ReportError::Write {
        path: path.to_path_buf(),
        source,
    }
}

/// Refuses the root folder and the home folder `home` themselves (compared after resolving
/// links and `..`) as output folders; their subfolders are fine. Checked before anything is
/// created, locked or written.
fn refuse_protected(target: &Path, home: Option<&Path>) -> Result<(), ReportError> {
    // A target that does not exist yet cannot be either folder.
    let Ok(resolved) = std::fs::canonicalize(target) else {
        return Ok(());
    };
    let what = if resolved == Path::new("/") {
        Some("the root folder")
    } else if home
        .filter(|h| !h.as_os_str().is_empty())
        .and_then(|h| std::fs::canonicalize(h).ok())
        .is_some_and(|h| h == resolved)
    {
        Some("the home folder ($HOME)")
    } else {
        None
    };
    match what {
        Some(what) => Err(ReportError::ProtectedFolder {
            path: target.to_path_buf(),
            what,
            example: target.join("stackwake-results"),
        }),
        None => Ok(()),
    }
}

impl Staging {
    /// Prepares to write into `target` (created now, and removed again if the run fails
    /// and leaves it empty): takes the folder's lock (waiting for another run), completes
    /// or removes what interrupted runs left, and creates the staging folder.
    pub fn begin(target: &Path) -> Result<Staging, ReportError> {
        refuse_protected(target, std::env::var_os("HOME").as_deref().map(Path::new))?;
        if target.exists() && !target.is_dir() {
            return Err(ReportError::NotAFolder {
                path: target.to_path_buf(),
            });
        }
        let created_target = !target.exists();
        std::fs::create_dir_all(target).map_err(|e| ReportError::CannotCreate {
            path: target.to_path_buf(),
            reason: blocking_ancestor(target)
                .map(|a| blocker_reason(&a))
                .unwrap_or_else(|| e.to_string()),
        })?;
        let give_up = |e: ReportError| {
            if created_target {
                let _ = std::fs::remove_dir(target);
            }
            e
        };
        let lock = FolderLock::acquire(target).map_err(|e| give_up(io_error(target, e)))?;
        cleanup::recover_stale(target).map_err(|e| give_up(io_error(target, e)))?;
        cleanup::remove_legacy(target);
        let tmp = target.join(format!("{STAGING_PREFIX}{}", std::process::id()));
        let mut runs = active();
        std::fs::create_dir(&tmp).map_err(|e| give_up(io_error(target, e)))?;
        runs.push(Active {
            staging: tmp.clone(),
            lock_file: lock.path().to_path_buf(),
            created_target: created_target.then(|| target.to_path_buf()),
        });
        Ok(Staging {
            target: target.to_path_buf(),
            tmp,
            files: Vec::new(),
            stamps: Vec::new(),
            committed: false,
            lock: Some(lock),
            created_target,
        })
    }

    /// The final folder.
    pub fn target(&self) -> &Path {
        &self.target
    }

    /// The staging folder (inside the target).
    pub fn staging_folder(&self) -> &Path {
        &self.tmp
    }

    /// Stages one file (a plain name, no folders).
    pub fn write(&mut self, name: &str, bytes: &[u8]) -> Result<(), ReportError> {
        let path = self.tmp.join(name);
        // Held so that the signal clean-up never races a file being created.
        let _runs = active();
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
    /// checked first, then the commit journal is written (from here on an interrupted
    /// commit is completed by the next run); a file being replaced is first moved aside
    /// into the staging folder, and if any move fails, the journal is removed, the files
    /// already moved are taken back out and the originals restored, so the folder is left
    /// as it was. The new [`MANIFEST`] moves in with the files, and the earlier run's files
    /// that this run does not write again are moved aside last (and put back if that
    /// fails); they are deleted with the staging folder. Returns the run's files (not the
    /// manifest).
    pub fn commit(mut self) -> Result<Vec<PathBuf>, ReportError> {
        let manifest = manifest_text(&self.files, &self.stamps);
        std::fs::write(self.tmp.join(MANIFEST), manifest.as_bytes())
            .map_err(|e| io_error(&self.target.join(MANIFEST), e))?;
        let mut names = self.files.clone();
        names.push(MANIFEST.to_string());
        for name in &names {
            check_destination(&self.target.join(name))?;
        }
        let obsolete = self.obsolete_files();
        // No signal clean-up while files move: it waits for this lock.
        let mut runs = active();
        let journal = Journal {
            files: names.clone(),
            obsolete: obsolete.clone(),
        };
        journal
            .write(&self.tmp)
            .map_err(|e| io_error(&self.tmp.join(journal::JOURNAL), e))?;
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
            let obsolete: Vec<String> = obsolete.into_iter().map(|(n, _)| n).collect();
            failure = self.move_aside(&obsolete, &mut moved).err();
        }
        if let Some((dest, source)) = failure {
            // Not to be completed by a later run: this run puts the folder back.
            let _ = std::fs::remove_file(self.tmp.join(journal::JOURNAL));
            if let Err(stuck) = self.roll_back(&mut moved) {
                // Keep the staging folder: it holds the originals not put back.
                self.committed = true;
                runs.retain(|a| a.staging != self.tmp);
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
        runs.retain(|a| a.staging != self.tmp);
        drop(runs);
        self.lock = None;
        Ok(moved
            .into_iter()
            .filter(|m| m.new_file && !m.dest.ends_with(MANIFEST))
            .map(|m| m.dest)
            .collect())
    }

    /// Files the earlier run's manifest lists, that this run does not write, and that are
    /// still exactly as that run wrote them.
    fn obsolete_files(&self) -> Vec<(String, Stamp)> {
        let Ok(text) = std::fs::read_to_string(self.target.join(MANIFEST)) else {
            return Vec::new();
        };
        manifest::parse_manifest(&text)
            .into_iter()
            .filter(|(name, _)| !self.files.contains(name))
            .filter(|(name, stamp)| stamp.matches(&self.target.join(name)))
            .collect()
    }

    /// Moves the earlier run's obsolete files into the staging folder (recorded in
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

/// Why `blocker` (an existing path that is not a folder) stops a folder being made there:
/// a dangling symbolic link reads as "File exists" from the OS, which names neither cause.
fn blocker_reason(blocker: &Path) -> String {
    let shown = blocker.display();
    match std::fs::symlink_metadata(blocker) {
        Ok(m) if m.file_type().is_symlink() => {
            let to = std::fs::read_link(blocker)
                .map(|t| t.display().to_string())
                .unwrap_or_else(|_| "an unreadable target".into());
            if blocker.exists() {
                format!("{shown} is a symbolic link to {to}, which is not a folder")
            } else {
                format!(
                    "{shown} is a symbolic link to {to}, which does not exist; \
                     remove the link or give another --out"
                )
            }
        }
        Ok(m) if m.is_file() => format!("{shown} is a file, not a folder"),
        _ => format!("{shown} exists and is not a folder"),
    }
}

/// A file moved into the target folder, with the original it replaced (if any); or, with
/// `new_file` false, an earlier run's file moved out of it into `backup`.
#[derive(Debug)]
struct Moved {
    dest: PathBuf,
    backup: Option<PathBuf>,
    new_file: bool,
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
            let mut runs = active();
            let _ = std::fs::remove_dir_all(&self.tmp);
            runs.retain(|a| a.staging != self.tmp);
            drop(runs);
            self.lock = None;
            if self.created_target {
                let _ = std::fs::remove_dir(&self.target);
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::manifest::parse_manifest;
    use super::*;

    #[test]
    fn root_and_home_are_refused_but_their_subfolders_are_not() {
        let home = tempfile::tempdir().unwrap();
        let sub = home.path().join("results");
        std::fs::create_dir(&sub).unwrap();
        let refused = |p: &Path| match refuse_protected(p, Some(home.path())) {
            Err(ReportError::ProtectedFolder { what, .. }) => Some(what),
            Err(e) => panic!("unexpected {e}"),
            Ok(()) => None,
        };
        assert_eq!(refused(Path::new("/")), Some("the root folder"));
        // Spelled otherwise, resolved to the same folder.
        assert_eq!(refused(Path::new("/tmp/..")), Some("the root folder"));
        assert_eq!(refused(home.path()), Some("the home folder ($HOME)"));
        assert_eq!(refused(&sub.join("..")), Some("the home folder ($HOME)"));
        let link = home.path().join("link-to-home");
        std::os::unix::fs::symlink(home.path(), &link).unwrap();
        assert_eq!(refused(&link), Some("the home folder ($HOME)"));
        assert_eq!(refused(&sub), None);
        assert_eq!(refused(&home.path().join("not-yet")), None);
        // No HOME, or an empty one: only the root folder is refused.
        assert!(refuse_protected(home.path(), None).is_ok());
        assert!(refuse_protected(home.path(), Some(Path::new(""))).is_ok());
    }

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
