//! Peak memory of one build, measured in a fresh process so that earlier runs and the
//! benchmark's own data do not count: the benchmark starts itself again with
//! `--peak-of LAYOUT`, the child builds once (pipeline and outputs in memory) and prints
//! the kernel's high-water mark of its resident set (`VmHWM` in /proc/self/status,
//! Linux's proc(5)); the parent reads that line. Elsewhere the figure is left out.

use std::path::Path;
use std::process::Command;

/// The line the child prints, followed by kibibytes.
const TAG: &str = "peak-kib ";

/// In the child: builds `layout` once and prints its peak resident set.
pub fn report_child(layout: &Path) -> Result<(), String> {
    let opts = segmask::emit::EmitOptions { date: "2000-01-01".into(), masks_despite_errors: true, png_dpi: segmask::emit::DEFAULT_PNG_DPI };
    let built = segmask::pipeline::build_layout_file(layout).map_err(|e| e.to_string())?;
    let files = segmask::emit::render_outputs_planned(&built.artwork, &built.findings, &built.plan, &opts).map_err(|e| e.to_string())?;
    std::hint::black_box(&files);
    let status = std::fs::read_to_string("/proc/self/status").map_err(|e| format!("/proc/self/status: {e}"))?;
    let kib = status
        .lines()
        .find_map(|l| l.strip_prefix("VmHWM:"))
        .and_then(|v| v.trim().trim_end_matches("kB").trim().parse::<u64>().ok())
        .ok_or("no VmHWM line in /proc/self/status")?;
    println!("{TAG}{kib}");
    Ok(())
}

/// In the parent: the peak resident set of one build of `layout`, in MiB, if it could be
/// measured.
pub fn peak_mib(layout: &Path) -> Option<f64> {
    let exe = std::env::current_exe().ok()?;
    let out = Command::new(exe).arg("--peak-of").arg(layout).output().ok()?;
    let text = String::from_utf8_lossy(&out.stdout);
    let kib: u64 = text.lines().find_map(|l| l.strip_prefix(TAG))?.trim().parse().ok()?;
    Some(kib as f64 / 1024.0)
}
