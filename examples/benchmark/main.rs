//! Benchmark: generates a large layout, builds it with the library pipeline and prints
//! the time of each stage (docs/performance.md).
//!
//! `cargo run --release --example benchmark -- [--digits N] [--icons M] [--rows R]
//! [--style seven|fourteen] [--duty static|1/2|1/3|1/4] [--preset NAME] [--out DIR]
//! [--repeat K] [--sweep]`
//!
//! The layout is written to DIR (so `segmask build DIR/NAME.yaml` rebuilds it), then built
//! K times; the table gives each stage's shortest and median time. `--sweep` builds 5, 10,
//! 20 and 40 digits (icons scaled in proportion) and prints routing time against digit
//! count. `--preset` names a fixed size (`presets.rs`). Times are printed, never compared
//! with a limit.

mod layout_gen;
mod measure;
mod peak;
mod presets;

use clap::Parser;
use layout_gen::{Drive, Params, Style};
use measure::Measured;
use std::path::{Path, PathBuf};
use std::process::ExitCode;
use std::time::Duration;

/// Generates a large benchmark layout, builds it and prints the time of each stage.
#[derive(Parser)]
#[command(name = "benchmark")]
struct Args {
    /// Number of digits (static drive: each with a decimal point).
    #[arg(long, default_value_t = 40)]
    digits: u32,
    /// Number of icons: static, in bands above the digits; multiplexed, under the bottom
    /// row (one under each digit, or a band when there are more icons than digits there).
    #[arg(long, default_value_t = 40)]
    icons: u32,
    /// Rows of digits [static: digits / 8, rounded up; multiplexed: 1].
    #[arg(long)]
    rows: Option<u32>,
    /// Digit style: seven or fourteen segments.
    #[arg(long, default_value = "seven", value_parser = Style::parse)]
    style: Style,
    /// Drive: static, 1/2, 1/3 or 1/4 (bias 1/3).
    #[arg(long, default_value = "1/4", value_parser = Drive::parse)]
    duty: Drive,
    /// A named size instead of --digits, --icons, --rows, --style and --duty:
    /// two-rows, two-rows-third or fourteen (docs/performance.md).
    #[arg(long, value_parser = presets::parse, conflicts_with_all = ["digits", "icons", "rows", "style", "duty", "sweep"])]
    preset: Option<Params>,
    /// Folder the generated layout files are written to.
    #[arg(long, default_value = "target/benchmark")]
    out: PathBuf,
    /// Builds per layout; the table gives the shortest and the median.
    #[arg(long, default_value_t = 3)]
    repeat: u32,
    /// Build 5, 10, 20 and 40 digits (icons scaled in proportion) and print route time
    /// against digit count.
    #[arg(long)]
    sweep: bool,
    /// Internal: build this layout once and print the peak resident set (the benchmark
    /// runs itself with it to measure each layout's peak memory in a fresh process).
    #[arg(long, hide = true)]
    peak_of: Option<PathBuf>,
}

fn main() -> ExitCode {
    let args = Args::parse();
    if let Some(layout) = &args.peak_of {
        return match peak::report_child(layout) {
            Ok(()) => ExitCode::SUCCESS,
            Err(e) => {
                eprintln!("benchmark: {e}");
                ExitCode::from(2)
            }
        };
    }
    print_machine(&args);
    let result = if args.sweep { sweep(&args) } else { single(&args) };
    match result {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("benchmark: {e}");
            ExitCode::from(2)
        }
    }
}

fn print_machine(args: &Args) {
    let cpus = std::thread::available_parallelism().map(|n| n.get().to_string()).unwrap_or_else(|_| "unknown".into());
    let profile = if cfg!(debug_assertions) { "dev (debug assertions on: not for figures)" } else { "release" };
    println!("segmask {} benchmark", env!("CARGO_PKG_VERSION"));
    println!("machine: {cpus} CPU(s) available, {} {}, cpu {}", std::env::consts::OS, std::env::consts::ARCH, cpu_model());
    println!("profile: {profile}; runs per layout: {}", args.repeat.max(1));
}

/// The first `model name` of /proc/cpuinfo, where there is one.
fn cpu_model() -> String {
    std::fs::read_to_string("/proc/cpuinfo")
        .ok()
        .and_then(|t| t.lines().find(|l| l.starts_with("model name")).and_then(|l| l.split(':').nth(1)).map(|s| s.trim().to_string()))
        .unwrap_or_else(|| "unknown".into())
}

/// Generates the layout and writes it atomically to `out`; returns its path.
fn write_layout(p: &Params, out: &Path) -> Result<PathBuf, String> {
    let g = layout_gen::generate(p)?;
    let file = segmask::emit::OutputFile { name: format!("{}.yaml", g.name), bytes: g.yaml.into_bytes() };
    segmask::emit::write_atomically(out, &[file]).map_err(|e| e.to_string())?;
    let path = out.join(format!("{}.yaml", g.name));
    println!("layout: {} ({} elements, {} pads needed, pad row sized for {})", path.display(), g.elements, g.pads, g.pins);
    Ok(path)
}

fn params(args: &Args, digits: u32, icons: u32, rows: Option<u32>) -> Params {
    Params { digits, rows, style: args.style, icons, drive: args.duty }
}

fn single(args: &Args) -> Result<(), String> {
    let p = args.preset.unwrap_or_else(|| params(args, args.digits, args.icons, args.rows));
    let path = write_layout(&p, &args.out)?;
    let m = measure::measure(&path, args.repeat).map_err(|e| e.to_string())?;
    print_table(&m);
    println!("peak memory of one build (fresh process): {}", mib(peak::peak_mib(&path)));
    Ok(())
}

fn mib(m: Option<f64>) -> String {
    m.map(|m| format!("{m:.0} MiB")).unwrap_or_else(|| "not measured (needs Linux /proc)".into())
}

fn secs(d: Duration) -> String {
    format!("{:.3}", d.as_secs_f64())
}

fn print_table(m: &Measured) {
    println!();
    println!("| stage | min (s) | median (s) |");
    println!("|---|---:|---:|");
    for s in &m.stages {
        println!("| {} | {} | {} |", s.stage, secs(s.min()), secs(s.median()));
    }
    let total_min = m.totals.iter().copied().min().unwrap_or_default();
    println!("| total | {} | {} |", secs(total_min), secs(measure::median(&m.totals)));
    let c = &m.counts;
    println!();
    println!(
        "elements {}, nets {}, pins {}, shapes {}, routing grid {:.1} M cells, findings {} ({} errors, {} warnings)",
        c.elements,
        c.nets,
        c.pins,
        c.shapes,
        c.grid_cells as f64 / 1e6,
        c.findings,
        c.errors,
        c.warnings
    );
}

/// Digit counts of the sweep.
const SWEEP: [u32; 4] = [5, 10, 20, 40];

fn sweep(args: &Args) -> Result<(), String> {
    let mut rows_out = Vec::new();
    for d in SWEEP {
        let icons = (f64::from(args.icons) * f64::from(d) / f64::from(args.digits.max(1))).round() as u32;
        let path = write_layout(&params(args, d, icons, None), &args.out)?;
        let m = measure::measure(&path, args.repeat).map_err(|e| e.to_string())?;
        let peak = peak::peak_mib(&path);
        rows_out.push((d, icons, m, peak));
    }
    println!();
    println!("| digits | icons | elements | grid (M cells) | route min (s) | route median (s) | growth | total median (s) | peak memory | errors |");
    println!("|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|");
    let mut last: Option<(u32, f64)> = None;
    for (d, icons, m, peak) in &rows_out {
        let route = m.stages.iter().find(|s| s.stage == "route").map(|s| s.median()).unwrap_or_default();
        let r = route.as_secs_f64();
        // Growth exponent k in time ∝ digits^k, from the previous row.
        let growth = match last {
            Some((d0, r0)) if r0 > 0.0 && r > 0.0 => format!("{:.2}", (r / r0).ln() / (f64::from(*d) / f64::from(d0)).ln()),
            _ => "—".into(),
        };
        let c = &m.counts;
        let route_min = m.stages.iter().find(|s| s.stage == "route").map(|s| s.min()).unwrap_or_default();
        println!(
            "| {d} | {icons} | {} | {:.1} | {} | {} | {growth} | {} | {} | {} |",
            c.elements,
            c.grid_cells as f64 / 1e6,
            secs(route_min),
            secs(route),
            secs(measure::median(&m.totals)),
            mib(*peak),
            c.errors
        );
        last = Some((*d, r));
    }
    println!();
    println!("growth: k in route time ∝ digits^k between this row and the one above");
    Ok(())
}
