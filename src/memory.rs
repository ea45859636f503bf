//! Giving freed heap memory back to the system between stages.
//!
//! The geometry stages work on all cores (rayon), and the C allocator keeps the blocks
//! each thread freed for that thread's own reuse, scattered in its heap so that it
//! cannot hand them back by itself; a stage that follows on one thread then allocates on
//! top of them. Asking the allocator to trim (glibc's `malloc_trim(3)`) returns every
//! whole free page. Elsewhere (other C libraries, other systems) this does nothing.

/// Returns the heap's free pages to the system (glibc on Linux; nothing elsewhere).
pub fn release_freed() {
    #[cfg(all(target_os = "linux", target_env = "gnu"))]
    // SAFETY: malloc_trim only returns free heap memory to the system; it touches no
    // memory in use and is safe to call at any time (glibc's malloc_trim(3)).
    unsafe {
        libc::malloc_trim(0);
    }
}
