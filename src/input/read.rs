//! Reading an input file (case file, stations CSV, measurements CSV) with hard limits that
//! hold whatever the path names: only regular files are read (a FIFO would block forever,
//! a device such as `/dev/zero` never ends), and at most [`MAX_INPUT_BYTES`] + 1 bytes are
//! read whatever the file's length claims (metadata says 0 bytes for a device), so no input
//! can make a run wait or fill the memory.

use std::fs::{File, Metadata};
use std::io::Read;
use std::os::unix::fs::{FileTypeExt, OpenOptionsExt};
use std::path::Path;

use super::{InputError, MegaBytes, MAX_INPUT_BYTES};

pub(crate) enum ReadFailure {
    Io(std::io::Error),
    Other(InputError),
}

/// What a non-regular file is, for the message.
fn what(meta: &Metadata) -> &'static str {
    let t = meta.file_type();
    if t.is_dir() {
        "a folder"
    } else if t.is_fifo() {
        "a named pipe (FIFO)"
    } else if t.is_block_device() || t.is_char_device() {
        "a device"
    } else if t.is_socket() {
        "a socket"
    } else {
        "not a plain file"
    }
}

/// Reads a UTF-8 text file of at most [`MAX_INPUT_BYTES`]. The file type is checked
/// (following symbolic links) before opening, and again on the opened file; the open is
/// non-blocking so that a FIFO swapped in between cannot block either.
pub(crate) fn read_limited(
    path: &Path,
    label: &str,
    kind: &'static str,
) -> Result<String, ReadFailure> {
    let not_regular = |meta: &Metadata| {
        ReadFailure::Other(InputError::NotRegularFile {
            label: label.to_string(),
            kind,
            what: what(meta),
        })
    };
    let meta = std::fs::metadata(path).map_err(ReadFailure::Io)?;
    if !meta.is_file() {
        return Err(not_regular(&meta));
    }
    if meta.len() > MAX_INPUT_BYTES {
        return Err(ReadFailure::Other(InputError::TooLarge {
            label: label.to_string(),
            kind,
            size: MegaBytes(meta.len()),
        }));
    }
    let file = std::fs::OpenOptions::new()
        .read(true)
        .custom_flags(libc::O_NONBLOCK)
        .open(path)
        .map_err(ReadFailure::Io)?;
    let meta = file.metadata().map_err(ReadFailure::Io)?;
    if !meta.is_file() {
        return Err(not_regular(&meta));
    }
    let bytes = read_capped(file, MAX_INPUT_BYTES).map_err(ReadFailure::Io)?;
    if bytes.len() as u64 > MAX_INPUT_BYTES {
        return Err(ReadFailure::Other(InputError::OverLimit {
            label: label.to_string(),
            kind,
        }));
    }
    String::from_utf8(bytes).map_err(|_| {
        ReadFailure::Other(InputError::NotText {
            label: label.to_string(),
        })
    })
}

/// At most `limit + 1` bytes of `file` (one more than allowed, to tell "at the limit" from
/// "over it").
fn read_capped(file: File, limit: u64) -> std::io::Result<Vec<u8>> {
    let mut bytes = Vec::new();
    file.take(limit + 1).read_to_end(&mut bytes)?;
    Ok(bytes)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_device_is_refused_before_reading() {
        let Err(ReadFailure::Other(e)) = read_limited(Path::new("/dev/zero"), "z", "case file")
        else {
            panic!("/dev/zero was read");
        };
        assert_eq!(
            e.to_string(),
            "z is a device, not a regular file; a case file must be a regular file of at most 10 MB"
        );
    }

    #[test]
    fn reading_stops_one_byte_past_the_limit() {
        let zero = File::open("/dev/zero").unwrap();
        assert_eq!(read_capped(zero, 1000).unwrap().len(), 1001);
    }

    #[test]
    fn a_folder_is_refused() {
        let dir = tempfile::tempdir().unwrap();
        let Err(ReadFailure::Other(e)) = read_limited(dir.path(), "d", "stations CSV") else {
            panic!("a folder was read");
        };
        assert!(
            e.to_string().contains("d is a folder, not a regular file"),
            "{e}"
        );
    }
}
