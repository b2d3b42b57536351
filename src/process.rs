//! Process-wide settings a binary applies once at start-up.
//!
//! Why: the eigen-solver's work blocks on a fine mesh are several megabytes each. glibc's
//! default serves such requests with fresh `mmap`s and unmaps them on free, so every stage
//! (and every repeat in a sweep) pays the kernel for faulting in and zeroing the same pages
//! again; measured on a 20 000-element stage, a quarter of the solve time. Raising the mmap
//! and trim thresholds keeps freed blocks in the heap for reuse. Other platforms and
//! allocators keep their defaults.

/// Lets the allocator reuse freed large blocks instead of returning them to the system.
/// Call once, before other threads start. Harmless if it cannot apply.
pub fn reuse_freed_blocks() {
    #[cfg(all(target_os = "linux", target_env = "gnu"))]
    {
        // glibc caps the mmap threshold at 32 MiB on 64-bit systems.
        const MMAP_THRESHOLD_BYTES: libc::c_int = 32 << 20;
        const TRIM_THRESHOLD_BYTES: libc::c_int = 1 << 30;
        // SAFETY: mallopt only adjusts allocator parameters; it is called before any other
        // thread exists, and a rejected value leaves the previous setting in place.
        unsafe {
            libc::mallopt(libc::M_MMAP_THRESHOLD, MMAP_THRESHOLD_BYTES);
            libc::mallopt(libc::M_TRIM_THRESHOLD, TRIM_THRESHOLD_BYTES);
        }
    }
}
