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
    // A folder is never replaced, with or without --force: `new` writes one case file.
    if path.is_dir() {
        return Err(Error::Usage {
            option: "FILE".into(),
            value: path.display().to_string(),
            rule: format!(
                "is a folder; `new` writes a case file: give a file name, e.g. {}",
                path.join(DEFAULT_FILE).display()
            ),
        });
    }
    if path.exists() && !force {
        return Err(Error::Usage {
            option: "FILE".into(),
            value: path.display().to_string(),
            rule: "already exists; choose another name or pass --force to replace it".into(),
        });
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
    let file_name = path
        .file_name()
        .map_or("case".into(), |n| n.to_string_lossy().into_owned());
    let (tmp, mut f) = create_temporary(&dir, &file_name).map_err(io)?;
    let result = (|| {
        f.write_all(STARTER_TOML.as_bytes())?;
        f.sync_all()?;
        drop(f);
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

/// Creates a new temporary file beside the target, exclusively and without following a
/// symlink: a name someone could guess (and plant a symlink at, to make us write through it
/// into another file) is never opened. The name carries the process id and a random part;
/// an existing name is skipped and another tried.
fn create_temporary(
    dir: &Path,
    file_name: &str,
) -> std::io::Result<(std::path::PathBuf, std::fs::File)> {
    use std::hash::{BuildHasher, Hasher};
    use std::os::unix::fs::OpenOptionsExt;
    const ATTEMPTS: u32 = 32;
    let mut last = None;
    for attempt in 0..ATTEMPTS {
        // `RandomState` is seeded from the system's random source for every new value;
        // the clock adds to it.
        let mut hasher = std::collections::hash_map::RandomState::new().build_hasher();
        let nanos = std::time::SystemTime::now()
            .duration_since(std::time::UNIX_EPOCH)
            .map_or(0, |d| d.as_nanos());
        hasher.write_u128(nanos);
        hasher.write_u32(attempt);
        let tmp = dir.join(format!(
            ".{file_name}.partial-{}-{:016x}",
            std::process::id(),
            hasher.finish()
        ));
        match std::fs::OpenOptions::new()
            .write(true)
            .create_new(true)
            .custom_flags(libc::O_NOFOLLOW)
            .open(&tmp)
        {
            Ok(f) => return Ok((tmp, f)),
            Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => last = Some(e),
            Err(e) => return Err(e),
        }
    }
    Err(last.unwrap_or_else(|| std::io::Error::from(std::io::ErrorKind::AlreadyExists)))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A symlink planted at the temporary name the earlier version used
    /// (`.NAME.partial-PID`) is neither followed nor replaced: the file it points to keeps
    /// its content, and the starter case lands in the named file.
    #[test]
    fn planted_symlink_at_the_old_temporary_name_is_not_followed() {
        let dir = tempfile::tempdir().unwrap();
        let victim = dir.path().join("victim.txt");
        std::fs::write(&victim, "precious").unwrap();
        let target = dir.path().join("case.toml");
        let planted = dir
            .path()
            .join(format!(".case.toml.partial-{}", std::process::id()));
        std::os::unix::fs::symlink(&victim, &planted).unwrap();
        run(&target, false).unwrap();
        assert_eq!(std::fs::read_to_string(&victim).unwrap(), "precious");
        assert_eq!(std::fs::read_to_string(&target).unwrap(), STARTER_TOML);
        assert!(std::fs::symlink_metadata(&planted)
            .unwrap()
            .file_type()
            .is_symlink());
        // Nothing else is left beside the target.
        let mut names: Vec<_> = std::fs::read_dir(dir.path())
            .unwrap()
            .map(|e| e.unwrap().file_name().into_string().unwrap())
            .collect();
        names.sort();
        let partial = format!(".case.toml.partial-{}", std::process::id());
        assert_eq!(names, [partial.as_str(), "case.toml", "victim.txt"]);
    }

    /// Every attempt draws a new name, so a name taken by someone else is skipped.
    #[test]
    fn temporary_names_differ_and_are_created_exclusively() {
        let dir = tempfile::tempdir().unwrap();
        let (a, _fa) = create_temporary(dir.path(), "case.toml").unwrap();
        let (b, _fb) = create_temporary(dir.path(), "case.toml").unwrap();
        assert_ne!(a, b);
        assert!(a
            .file_name()
            .unwrap()
            .to_str()
            .unwrap()
            .starts_with(&format!(".case.toml.partial-{}-", std::process::id())));
    }

    #[test]
    fn starter_parses_and_validates() {
        let case = crate::input::parse_case(STARTER_TOML, Path::new("."), "starter")
            .expect("the starter template must be a valid case");
        assert_eq!(case.stages.len(), 2);
        assert_eq!(case.linings.len(), 1);
        assert!(case.title.contains("Invented"));
    }

    /// The field names of a serde struct, read from its derive (the list serde passes to
    /// `deserialize_struct`), so the key list can never drift from what the reader accepts.
    fn serde_fields<T: serde::de::DeserializeOwned>() -> &'static [&'static str] {
        use serde::de::{Error as _, Visitor};
        struct Grab<'a>(&'a mut &'static [&'static str]);
        impl<'de> serde::Deserializer<'de> for Grab<'_> {
            type Error = serde::de::value::Error;
            fn deserialize_any<V: Visitor<'de>>(self, _: V) -> Result<V::Value, Self::Error> {
                Err(Self::Error::custom("not a struct"))
            }
            fn deserialize_struct<V: Visitor<'de>>(
                self,
                _: &'static str,
                fields: &'static [&'static str],
                _: V,
            ) -> Result<V::Value, Self::Error> {
                *self.0 = fields;
                Err(Self::Error::custom("fields read"))
            }
            serde::forward_to_deserialize_any! {
                bool i8 i16 i32 i64 i128 u8 u16 u32 u64 u128 f32 f64 char str string bytes
                byte_buf option unit unit_struct newtype_struct seq tuple tuple_struct map
                enum identifier ignored_any
            }
        }
        let mut fields: &'static [&'static str] = &[];
        let _ = T::deserialize(Grab(&mut fields));
        assert!(
            !fields.is_empty(),
            "{} has no fields",
            std::any::type_name::<T>()
        );
        fields
    }

    /// The template's lines with any leading comment marks taken off, each with the section
    /// header above it (`""` before the first header): a commented-out key counts.
    fn template_keys() -> Vec<(String, String)> {
        let mut section = String::new();
        let mut out = Vec::new();
        for line in STARTER_TOML.lines() {
            let l = line.trim_start_matches(|c: char| c == '#' || c.is_whitespace());
            let head = l.split('#').next().unwrap_or("").trim();
            let name = head.trim_start_matches('[').trim_end_matches(']');
            if head.starts_with('[')
                && head.ends_with(']')
                && !name.is_empty()
                && name
                    .chars()
                    .all(|c| c.is_ascii_lowercase() || c == '_' || c == '.')
            {
                section = name.to_string();
                out.push((String::new(), section.clone()));
                continue;
            }
            // `key = ...`, also inside an inline table row `{ z_m = 0.0, ... }`.
            for part in l.split(['{', ',']) {
                if let Some((key, _)) = part.split_once('=') {
                    let key = key.trim();
                    if !key.is_empty()
                        && key
                            .chars()
                            .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '_')
                    {
                        out.push((section.clone(), key.to_string()));
                    }
                }
            }
        }
        out
    }

    #[test]
    fn template_shows_every_key_the_reader_accepts() {
        use crate::input::raw::*;
        let keys = template_keys();
        let has = |section: &str, key: &str| keys.iter().any(|(s, k)| s == section && k == key);
        // Sections: each top-level key is a header, an array-of-tables header or a key.
        let sub_sections = [
            "shell.stations",
            "shell.zone",
            "vortex.group",
            "remedy.tmd",
            "remedy.strakes",
            "reinforcement.zone",
        ];
        for key in serde_fields::<RawCase>() {
            let prefix = format!("{key}.");
            assert!(
                keys.iter()
                    .any(|(s, k)| s.is_empty() && (k == key || k.starts_with(&prefix))),
                "data/starter.toml does not show the section or key `{key}`"
            );
        }
        let nested: &[(&str, &[&str])] = &[
            ("shell", serde_fields::<RawShell>()),
            ("shell", serde_fields::<RawStation>()),
            ("shell.zone", serde_fields::<RawZone>()),
            ("opening", serde_fields::<RawOpening>()),
            ("lining", serde_fields::<RawLining>()),
            ("point_mass", serde_fields::<RawPointMass>()),
            ("base", serde_fields::<RawBase>()),
            ("stage", serde_fields::<RawStage>()),
            ("wind", serde_fields::<RawWind>()),
            ("along_wind", serde_fields::<RawAlongWind>()),
            ("vortex", serde_fields::<RawVortex>()),
            ("vortex.group", serde_fields::<RawGroup>()),
            ("criteria", serde_fields::<RawCriteria>()),
            ("model", serde_fields::<RawModel>()),
            ("remedy", serde_fields::<RawRemedy>()),
            ("remedy.tmd", serde_fields::<RawTmd>()),
            ("remedy.strakes", serde_fields::<RawStrakes>()),
            ("project", serde_fields::<RawProject>()),
            ("reinforcement", serde_fields::<RawReinforcement>()),
            ("reinforcement.zone", serde_fields::<RawReinforcementZone>()),
            ("design", serde_fields::<RawDesign>()),
        ];
        for (section, fields) in nested {
            for key in *fields {
                let sub = format!("{section}.{key}");
                assert!(
                    has(section, key) || sub_sections.contains(&sub.as_str()) && has("", &sub),
                    "data/starter.toml does not show `{key}` under [{section}]"
                );
            }
        }
        // Every section of the case file has its entry above (a new section must be added
        // there, with its keys, when it is added to RawCase).
        for key in serde_fields::<RawCase>() {
            let covered = nested.iter().any(|(s, _)| s == key) || *key == "title";
            assert!(covered, "section `{key}` has no key list in this test");
        }
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
