//! The commit journal that makes a commit recoverable. Before the first file is moved into
//! the output folder, the staging folder gets `commit-journal` (written to a temporary name and
//! renamed, so it is either complete or absent), listing every staged file and the earlier
//! run's files to be moved out. From then on the commit is decided: if the run is killed
//! during the moves, the next run into the folder finds the journal and completes the
//! moves (`roll_forward`); a staging folder without a journal was never committed and is
//! simply removed. Each step of the roll-forward can be repeated, so a second kill during
//! the recovery is recovered the same way.

use std::path::Path;

use super::manifest::{entry_line, parse_entry, plain_name, Stamp};

/// The journal file inside a staging folder.
pub(crate) const JOURNAL: &str = "commit-journal";

/// Suffix of an original output file kept in the staging folder during a commit.
pub(crate) const BACKUP_SUFFIX: &str = ".previous";

/// Folder inside the staging folder that holds an earlier run's obsolete files during a
/// commit (a name no staged file has: staged names are plain output names).
pub(crate) const OBSOLETE_FOLDER: &str = "obsolete-outputs.d";

/// What a commit will do: the staged files to move in, the obsolete files to move out.
#[derive(Debug, Default, PartialEq, Eq)]
pub(crate) struct Journal {
    pub(crate) files: Vec<String>,
    pub(crate) obsolete: Vec<(String, Stamp)>,
}

impl Journal {
    fn text(&self) -> String {
        let mut s = String::from("stackwake commit journal 1\n");
        for f in &self.files {
            s.push_str(&format!("file {f}\n"));
        }
        for (name, st) in &self.obsolete {
            s.push_str(&format!("obsolete {}\n", entry_line(name, st)));
        }
        s.push_str("end\n");
        s
    }

    /// Parses a journal; `None` unless complete (first and last lines present).
    fn parse(text: &str) -> Option<Journal> {
        let mut lines = text.lines();
        if lines.next()? != "stackwake commit journal 1" || text.lines().last()? != "end" {
            return None;
        }
        let mut j = Journal::default();
        for l in lines {
            if let Some(name) = l.strip_prefix("file ") {
                if plain_name(name) || name == super::MANIFEST {
                    j.files.push(name.to_string());
                }
            } else if let Some(entry) = l.strip_prefix("obsolete ") {
                j.obsolete.extend(parse_entry(entry));
            }
        }
        Some(j)
    }

    /// Writes the journal into `staging` atomically (temporary name, sync, rename).
    pub(crate) fn write(&self, staging: &Path) -> std::io::Result<()> {
        use std::io::Write;
        let tmp = staging.join(format!("{JOURNAL}.tmp"));
        let mut f = std::fs::File::create(&tmp)?;
        f.write_all(self.text().as_bytes())?;
        f.sync_all()?;
        std::fs::rename(&tmp, staging.join(JOURNAL))
    }

    /// The complete journal of a staging folder, if it has one.
    pub(crate) fn read(staging: &Path) -> Option<Journal> {
        let text = std::fs::read_to_string(staging.join(JOURNAL)).ok()?;
        Journal::parse(&text)
    }
}

/// Completes an interrupted commit: moves in every staged file still in `staging` (the
/// replaced file goes to `NAME.previous` in `staging`), then moves out the obsolete files
/// that are still as the earlier run wrote them. Files already moved are skipped.
pub(crate) fn roll_forward(target: &Path, staging: &Path, j: &Journal) -> std::io::Result<()> {
    for name in &j.files {
        let src = staging.join(name);
        if std::fs::symlink_metadata(&src).is_err() {
            continue; // moved in before the interruption
        }
        let dest = target.join(name);
        if std::fs::symlink_metadata(&dest).is_ok_and(|m| m.is_file()) {
            std::fs::rename(&dest, staging.join(format!("{name}{BACKUP_SUFFIX}")))?;
        }
        std::fs::rename(&src, &dest)?;
    }
    if !j.obsolete.is_empty() {
        let aside = staging.join(OBSOLETE_FOLDER);
        if let Err(e) = std::fs::create_dir(&aside) {
            if e.kind() != std::io::ErrorKind::AlreadyExists {
                return Err(e);
            }
        }
        for (name, stamp) in &j.obsolete {
            let dest = target.join(name);
            if stamp.matches(&dest) {
                std::fs::rename(&dest, aside.join(name))?;
            }
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_journal_reads_back_and_a_torn_one_does_not() {
        let j = Journal {
            files: vec!["a.csv".into(), super::super::MANIFEST.into()],
            obsolete: vec![("old.svg".into(), Stamp::of(b"x"))],
        };
        assert_eq!(Journal::parse(&j.text()), Some(j));
        assert_eq!(
            Journal::parse("stackwake commit journal 1\nfile a.csv\n"),
            None
        );
    }

    #[test]
    fn an_interrupted_commit_is_completed() {
        let dir = tempfile::tempdir().unwrap();
        let (target, staging) = (dir.path().join("out"), dir.path().join("stage"));
        std::fs::create_dir_all(&target).unwrap();
        std::fs::create_dir_all(&staging).unwrap();
        // a.csv was moved in before the kill; b.csv was not; old.svg is obsolete.
        std::fs::write(target.join("a.csv"), b"new a").unwrap();
        std::fs::write(target.join("b.csv"), b"old b").unwrap();
        std::fs::write(staging.join("b.csv"), b"new b").unwrap();
        std::fs::write(target.join("old.svg"), b"x").unwrap();
        let j = Journal {
            files: vec!["a.csv".into(), "b.csv".into()],
            obsolete: vec![("old.svg".into(), Stamp::of(b"x"))],
        };
        roll_forward(&target, &staging, &j).unwrap();
        roll_forward(&target, &staging, &j).unwrap(); // repeatable
        assert_eq!(std::fs::read(target.join("a.csv")).unwrap(), b"new a");
        assert_eq!(std::fs::read(target.join("b.csv")).unwrap(), b"new b");
        assert!(!target.join("old.svg").exists());
    }
}
