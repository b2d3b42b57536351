//! The output manifest [`MANIFEST`]: which files the last run wrote into a folder, with the
//! length and a 64-bit FNV-1a hash of each, so the next run can remove the ones it does not
//! write again unless the user changed them since.

/// The file in each output folder that lists what the last run wrote there.
pub const MANIFEST: &str = ".stackwake-manifest";

/// Length and 64-bit FNV-1a hash of a file's bytes: enough to tell whether a file is still
/// the one a run wrote (this is a guard against deleting a user's edit, not a security
/// check).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) struct Stamp {
    pub(crate) len: u64,
    pub(crate) fnv1a: u64,
}

impl Stamp {
    pub(crate) fn of(bytes: &[u8]) -> Stamp {
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

    /// Whether `path` is a plain file with exactly these bytes.
    pub(crate) fn matches(&self, path: &std::path::Path) -> bool {
        let plain = std::fs::symlink_metadata(path).is_ok_and(|m| m.is_file());
        plain && std::fs::read(path).is_ok_and(|b| Stamp::of(&b) == *self)
    }
}

/// One manifest line: `HASH LENGTH NAME`.
pub(crate) fn entry_line(name: &str, st: &Stamp) -> String {
    format!("{:016x} {} {name}", st.fnv1a, st.len)
}

/// The manifest: a comment header, then `HASH LENGTH NAME` per file.
pub(crate) fn manifest_text(files: &[String], stamps: &[Stamp]) -> String {
    let mut s = String::from(
        "# Files the last stackwake run wrote into this folder (FNV-1a hash, length, name).\n\
         # The next run into this folder removes those it does not write again, unless they\n\
         # were changed since; files not listed here are never touched.\n",
    );
    for (name, st) in files.iter().zip(stamps) {
        s.push_str(&entry_line(name, st));
        s.push('\n');
    }
    s
}

/// Whether `name` is a plain file name inside the folder (no path, no control characters).
pub(crate) fn plain_name(name: &str) -> bool {
    !name.is_empty()
        && name != "."
        && name != ".."
        && name != MANIFEST
        && !name.contains(['/', '\\'])
        && !name.chars().any(char::is_control)
}

/// Parses one `HASH LENGTH NAME` line.
pub(crate) fn parse_entry(line: &str) -> Option<(String, Stamp)> {
    let mut parts = line.splitn(3, ' ');
    let hash = u64::from_str_radix(parts.next()?, 16).ok()?;
    let len = parts.next()?.parse().ok()?;
    let name = parts.next()?;
    plain_name(name).then(|| (name.to_string(), Stamp { len, fnv1a: hash }))
}

/// The entries of a manifest. Lines that are not exactly what [`manifest_text`] writes,
/// or that name anything but a plain file name in the folder, are ignored: a damaged or
/// hand-edited manifest can only make a run remove less.
pub(crate) fn parse_manifest(text: &str) -> Vec<(String, Stamp)> {
    text.lines()
        .filter(|l| !l.starts_with('#'))
        .filter_map(parse_entry)
        .collect()
}
