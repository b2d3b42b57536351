//! `new`: writes a fully commented starter case file (every key with its unit, default and
//! where the value usually comes from). The template is data/starter.toml, embedded at
//! compile time; a unit test checks that it parses and validates as it is.

use std::io::Write;
use std::path::Path;

use crate::error::Error;
use crate::report::ReportError;

use super::CommandReport;

/// The commented starter case file.
pub const STARTER_TOML: &str = include_str!("../../data/starter.toml");

/// Default file name of `stackwake new`.
pub const DEFAULT_FILE: &str = "case.toml";

/// Writes the starter case to `path`; refuses to replace an existing file unless `force`.
pub fn run(path: &Path, force: bool) -> Result<CommandReport, Error> {
    if path.exists() && !force {
        return Err(Error::Usage {
            option: "FILE".into(),
            value: path.display().to_string(),
            rule: "already exists; choose another name or pass --force to replace it".into(),
        });
    }
    if path.is_dir() {
        return Err(ReportError::NotAFolder {
            path: path.to_path_buf(),
        }
        .into());
    }
    let io = |source| ReportError::Write {
        path: path.to_path_buf(),
        source,
    };
    // Write beside the target and rename, so a failed write never leaves half a file.
    let dir = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => std::path::PathBuf::from("."),
    };
    let tmp = dir.join(format!(
        ".{}.partial-{}",
        path.file_name()
            .map_or("case".into(), |n| n.to_string_lossy().into_owned()),
        std::process::id()
    ));
    let result = (|| {
        let mut f = std::fs::File::create(&tmp)?;
        f.write_all(STARTER_TOML.as_bytes())?;
        f.sync_all()?;
        std::fs::rename(&tmp, path)
    })();
    if let Err(e) = result {
        let _ = std::fs::remove_file(&tmp);
        return Err(io(e).into());
    }
    Ok(CommandReport {
        stdout: format!(
            "wrote the starter case {} (invented placeholder values: replace them with your \
             design data)\nnext: stackwake check {} --out results\n",
            path.display(),
            path.display()
        ),
        warnings: Vec::new(),
        check_failed: false,
        not_judged: false,
        files: Vec::new(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn starter_parses_and_validates() {
        let case = crate::input::parse_case(STARTER_TOML, Path::new("."), "starter")
            .expect("the starter template must be a valid case");
        assert_eq!(case.stages.len(), 2);
        assert_eq!(case.linings.len(), 1);
        assert!(case.title.contains("Invented"));
    }

    #[test]
    fn refuses_to_overwrite_without_force() {
        let dir = tempfile::tempdir().unwrap();
        let p = dir.path().join("c.toml");
        std::fs::write(&p, "keep").unwrap();
        let e = run(&p, false).unwrap_err().to_string();
        assert!(e.contains("already exists"), "{e}");
        assert_eq!(std::fs::read_to_string(&p).unwrap(), "keep");
        run(&p, true).unwrap();
        assert_eq!(std::fs::read_to_string(&p).unwrap(), STARTER_TOML);
        assert_eq!(std::fs::read_dir(dir.path()).unwrap().count(), 1);
    }
}
