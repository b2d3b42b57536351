//! The advisory lock that serialises runs into one output folder: an exclusive `flock` on
//! [`LOCK_FILE`] inside the folder, held from the creation of the staging folder to the end
//! of the commit (or the removal of the staging folder). A second run into the same folder
//! prints that it is waiting and waits; runs into other folders are not affected.
//!
//! The lock file is removed when the lock is released (while still held), so a folder is
//! left without it. A run that was waiting then holds a lock on a removed file, so after
//! locking it checks that the path still names the file it locked, and starts over if not.

use std::fs::File;
use std::os::unix::fs::{MetadataExt, OpenOptionsExt};
use std::os::unix::io::AsRawFd;
use std::path::{Path, PathBuf};

/// The lock file inside an output folder.
pub const LOCK_FILE: &str = ".stackwake-lock";

/// A held lock on an output folder; released (and its file removed) on drop.
#[derive(Debug)]
pub(crate) struct FolderLock {
    file: File,
    path: PathBuf,
}

fn flock(file: &File, op: libc::c_int) -> std::io::Result<()> {
    loop {
        // SAFETY: flock on a file descriptor this process owns; no memory is passed.
        if unsafe { libc::flock(file.as_raw_fd(), op) } == 0 {
            return Ok(());
        }
        let e = std::io::Error::last_os_error();
        if e.kind() != std::io::ErrorKind::Interrupted {
            return Err(e);
        }
    }
}

impl FolderLock {
    /// Locks `dir` (which must exist), waiting for another run that holds it.
    pub(crate) fn acquire(dir: &Path) -> std::io::Result<FolderLock> {
        let path = dir.join(LOCK_FILE);
        let mut announced = false;
        loop {
            let file = std::fs::OpenOptions::new()
                .read(true)
                .write(true)
                .create(true)
                .truncate(false)
                .custom_flags(libc::O_NOFOLLOW | libc::O_CLOEXEC)
                .open(&path)?;
            if let Err(e) = flock(&file, libc::LOCK_EX | libc::LOCK_NB) {
                if e.raw_os_error() != Some(libc::EWOULDBLOCK) {
                    return Err(e);
                }
                if !announced {
                    eprintln!(
                        "stackwake: waiting for another stackwake run that is writing into {}",
                        dir.display()
                    );
                    announced = true;
                }
                flock(&file, libc::LOCK_EX)?;
            }
            let held = file.metadata()?;
            match std::fs::symlink_metadata(&path) {
                Ok(now) if now.ino() == held.ino() && now.dev() == held.dev() => {
                    return Ok(FolderLock { file, path });
                }
                // The run before removed the file while we waited: lock the new one.
                _ => continue,
            }
        }
    }

    /// The lock file.
    pub(crate) fn path(&self) -> &Path {
        &self.path
    }
}

impl Drop for FolderLock {
    fn drop(&mut self) {
        // Removed while still locked; closing the file then releases the lock.
        let _ = std::fs::remove_file(&self.path);
        let _ = &self.file;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_lock_file_goes_with_the_lock_and_a_second_lock_waits() {
        let dir = tempfile::tempdir().unwrap();
        let first = FolderLock::acquire(dir.path()).unwrap();
        assert!(dir.path().join(LOCK_FILE).is_file());
        let probe = File::open(first.path()).unwrap();
        assert!(flock(&probe, libc::LOCK_EX | libc::LOCK_NB).is_err());
        drop(first);
        assert!(!dir.path().join(LOCK_FILE).exists());
        let second = FolderLock::acquire(dir.path()).unwrap();
        drop(second);
    }
}
