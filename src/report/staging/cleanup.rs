//! Leftovers of runs that did not finish, and clean-up when a run is stopped.
//!
//! **Stale staging folders.** A run creates its staging folder `.stackwake-staging-PID`
//! inside the output folder, and creates and removes it only while it holds the folder's
//! lock (see `lock.rs`). So a run that holds the lock and finds a staging folder knows it
//! belongs to a run that is gone (killed, or crashed), whatever process now has that PID
//! (PIDs are reused): it completes that run's commit if its journal says the commit was
//! decided, and removes the folder. Staging folders of older versions, `.OUT.partial-PID`
//! beside the output folder, were not protected by a lock: they are removed only when no
//! process has that PID (`kill(pid, 0)` fails with `ESRCH`); one whose PID is alive (maybe
//! reused) is left alone.
//!
//! **Ctrl-C and SIGTERM.** [`clean_up_on_signals`] installs handlers that only write the
//! signal number to a pipe; a thread reading the pipe then removes the staging folders of
//! the runs in progress (waiting for a commit that is under way to finish, so the folder
//! is never left half-committed), releases their locks and exits with 128 + the signal.

use std::path::{Path, PathBuf};
use std::sync::Mutex;

use super::journal::{roll_forward, Journal};

/// Prefix of a staging folder inside the output folder (the PID follows).
pub const STAGING_PREFIX: &str = ".stackwake-staging-";

/// A run in progress, as the signal clean-up needs it.
#[derive(Debug)]
pub(crate) struct Active {
    pub(crate) staging: PathBuf,
    pub(crate) lock_file: PathBuf,
    /// The output folder, when this run created it (removed again if left empty).
    pub(crate) created_target: Option<PathBuf>,
}

/// Runs in progress; a commit holds this lock while it moves files, so the signal clean-up
/// waits for it.
pub(crate) static ACTIVE: Mutex<Vec<Active>> = Mutex::new(Vec::new());

pub(crate) fn active() -> std::sync::MutexGuard<'static, Vec<Active>> {
    ACTIVE.lock().unwrap_or_else(|e| e.into_inner())
}

/// Removes a run's leftovers (its staging folder, lock file and the empty output folder it
/// created).
pub(crate) fn remove(a: &Active) {
    let _ = std::fs::remove_dir_all(&a.staging);
    let _ = std::fs::remove_file(&a.lock_file);
    if let Some(t) = &a.created_target {
        let _ = std::fs::remove_dir(t);
    }
}

/// With the lock on `target` held: completes or removes every staging folder left in it.
pub(crate) fn recover_stale(target: &Path) -> std::io::Result<()> {
    let Ok(entries) = std::fs::read_dir(target) else {
        return Ok(());
    };
    for entry in entries.flatten() {
        let name = entry.file_name().to_string_lossy().into_owned();
        let Some(pid) = name.strip_prefix(STAGING_PREFIX) else {
            continue;
        };
        if pid.parse::<u32>().is_err() || !entry.file_type().is_ok_and(|t| t.is_dir()) {
            continue;
        }
        let staging = entry.path();
        if let Some(j) = Journal::read(&staging) {
            roll_forward(target, &staging, &j)?;
        }
        std::fs::remove_dir_all(&staging)?;
    }
    Ok(())
}

/// Whether no process has this PID.
fn pid_is_gone(pid: i32) -> bool {
    // SAFETY: signal 0 only checks for existence and permission; nothing is sent.
    let r = unsafe { libc::kill(pid, 0) };
    r == -1 && std::io::Error::last_os_error().raw_os_error() == Some(libc::ESRCH)
}

/// Removes `.NAME.partial-PID` folders of older versions beside `target` whose process is
/// gone (best effort: the parent folder may not be writable).
pub(crate) fn remove_legacy(target: &Path) {
    let (Some(parent), Some(name)) = (target.parent(), target.file_name()) else {
        return;
    };
    let parent = if parent.as_os_str().is_empty() {
        Path::new(".")
    } else {
        parent
    };
    let prefix = format!(".{}.partial-", name.to_string_lossy());
    let Ok(entries) = std::fs::read_dir(parent) else {
        return;
    };
    for entry in entries.flatten() {
        let file_name = entry.file_name().to_string_lossy().into_owned();
        let pid = file_name
            .strip_prefix(&prefix)
            .and_then(|p| p.parse::<i32>().ok());
        if let Some(pid) = pid {
            if pid > 0 && entry.file_type().is_ok_and(|t| t.is_dir()) && pid_is_gone(pid) {
                let _ = std::fs::remove_dir_all(entry.path());
            }
        }
    }
}

static PIPE_WRITE: std::sync::atomic::AtomicI32 = std::sync::atomic::AtomicI32::new(-1);

extern "C" fn on_signal(sig: libc::c_int) {
    let fd = PIPE_WRITE.load(std::sync::atomic::Ordering::Relaxed);
    let byte = sig as u8;
    // SAFETY: write(2) is async-signal-safe; the buffer is a local byte.
    unsafe {
        libc::write(fd, (&byte as *const u8).cast(), 1);
    }
}

/// Installs the Ctrl-C (SIGINT) and SIGTERM clean-up (once per process; the binary calls
/// it at start-up). Returns false if the handlers could not be installed.
pub fn clean_up_on_signals() -> bool {
    static ONCE: std::sync::OnceLock<bool> = std::sync::OnceLock::new();
    *ONCE.get_or_init(|| {
        let mut fds = [0 as libc::c_int; 2];
        // SAFETY: pipe2 fills the two-element array.
        if unsafe { libc::pipe2(fds.as_mut_ptr(), libc::O_CLOEXEC) } != 0 {
            return false;
        }
        PIPE_WRITE.store(fds[1], std::sync::atomic::Ordering::Relaxed);
        let read_fd = fds[0];
        let spawned = std::thread::Builder::new()
            .name("stackwake-signals".into())
            .spawn(move || {
                let mut byte = 0u8;
                // SAFETY: reads one byte into a local.
                let n = unsafe { libc::read(read_fd, (&mut byte as *mut u8).cast(), 1) };
                if n == 1 {
                    let runs = active();
                    runs.iter().for_each(remove);
                    // SAFETY: ends the process without running other threads' code.
                    unsafe { libc::_exit(128 + i32::from(byte)) };
                }
            });
        if spawned.is_err() {
            return false;
        }
        [libc::SIGINT, libc::SIGTERM].iter().all(|&sig| {
            // SAFETY: installs a handler that only calls write(2).
            unsafe {
                let mut action: libc::sigaction = std::mem::zeroed();
                action.sa_sigaction = on_signal as extern "C" fn(libc::c_int) as usize;
                action.sa_flags = libc::SA_RESTART;
                libc::sigemptyset(&mut action.sa_mask);
                libc::sigaction(sig, &action, std::ptr::null_mut()) == 0
            }
        })
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_killed_commit_is_completed_and_an_uncommitted_run_removed() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path();
        std::fs::write(target.join("a.csv"), b"old").unwrap();
        // Killed during its moves: the journal was written, a.csv not yet moved in.
        let killed = target.join(format!("{STAGING_PREFIX}4000001"));
        std::fs::create_dir(&killed).unwrap();
        std::fs::write(killed.join("a.csv"), b"new").unwrap();
        Journal {
            files: vec!["a.csv".into()],
            obsolete: Vec::new(),
        }
        .write(&killed)
        .unwrap();
        // Killed while staging: no journal, its file must not reach the folder.
        let staging = target.join(format!("{STAGING_PREFIX}4000002"));
        std::fs::create_dir(&staging).unwrap();
        std::fs::write(staging.join("b.csv"), b"half").unwrap();
        recover_stale(target).unwrap();
        assert_eq!(std::fs::read(target.join("a.csv")).unwrap(), b"new");
        assert!(!target.join("b.csv").exists());
        assert!(!killed.exists() && !staging.exists());
    }
}
