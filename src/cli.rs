//! Command-line interface: parses arguments, runs the pipeline, prints diagnostics.
//!
//! Exit codes: 0 clean, 1 rule errors found, 2 bad input, I/O error or bug. Every
//! argument is checked before any work; a closed or full console stream never changes
//! the exit code of a build or check (`console.rs`).

use crate::console;
use clap::{Parser, Subcommand};
use segmask::error::InputProblem;
use segmask::finding::{Finding, Severity};
use segmask::pipeline::Built;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Turns a segment-LCD layout into ITO artwork for both plates, checks it, and writes
/// films, GDSII and the pin map.
#[derive(Parser)]
#[command(name = "segmask", version, about)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Build the artwork and write films, preview, GDSII, pin map and report.
    Build {
        /// Layout file (YAML).
        layout: PathBuf,
        /// Output folder (created if missing).
        #[arg(long, default_value = "out")]
        out: PathBuf,
        /// Write films and GDSII even while rule errors stand (the report is always written).
        #[arg(long)]
        masks_despite_errors: bool,
        /// Date printed on films and stored in GDSII, YYYY-MM-DD [default: today].
        #[arg(long)]
        date: Option<String>,
        /// Print the time each stage took.
        #[arg(long)]
        timings: bool,
        /// Resolution of the PNG films, dots per inch.
        #[arg(long, default_value_t = segmask::emit::DEFAULT_PNG_DPI)]
        png_dpi: f32,
        #[command(flatten)]
        input: InputArgs,
        /// Seconds to wait while another segmask run writes into the same folder.
        #[arg(long, default_value_t = 60, value_parser = clap::value_parser!(u64).range(0..=3600))]
        lock_wait: u64,
    },
    /// Build the artwork in memory and print the findings; writes nothing.
    Check {
        /// Layout file (YAML).
        layout: PathBuf,
        /// How to print the findings: `text` like compiler diagnostics on standard
        /// error, or `json`, one document on standard output (docs/commands.md).
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
        #[command(flatten)]
        input: InputArgs,
    },
    /// Build the artwork and draw the display showing a text and elements switched on,
    /// as the glass would show it (`NAME.show.svg` and `NAME.show.png`).
    Show {
        /// Layout file (YAML).
        layout: PathBuf,
        /// Text for the digits, one character a position, `.` and `:` after a position
        /// that has a point or colon (e.g. "88:88").
        #[arg(long, default_value = "")]
        text: String,
        /// Elements to switch on besides the text: legend, icon, gauge-part or step
        /// names, comma-separated.
        #[arg(long, value_delimiter = ',')]
        on: Vec<String>,
        /// Output folder (created if missing).
        #[arg(long, default_value = "out")]
        out: PathBuf,
        /// Resolution of the PNG, dots per inch.
        #[arg(long, default_value_t = 300.0)]
        dpi: f32,
        #[command(flatten)]
        input: InputArgs,
        /// Seconds to wait while another segmask run writes into the same folder.
        #[arg(long, default_value_t = 60, value_parser = clap::value_parser!(u64).range(0..=3600))]
        lock_wait: u64,
    },
    /// Build, then build again each time the layout (or a font file it reads) is saved,
    /// printing one line per build; Ctrl-C ends it.
    Watch {
        /// Layout file (YAML).
        layout: PathBuf,
        /// Output folder (created if missing).
        #[arg(long, default_value = "out")]
        out: PathBuf,
        /// Write films and GDSII even while rule errors stand (the report is always written).
        #[arg(long)]
        masks_despite_errors: bool,
        /// Resolution of the PNG films, dots per inch.
        #[arg(long, default_value_t = segmask::emit::DEFAULT_PNG_DPI)]
        png_dpi: f32,
        #[command(flatten)]
        input: InputArgs,
    },
    /// Write a commented starter layout NAME.yaml that builds clean.
    New {
        /// Name of the display: the layout's `name` and the file's stem (letters, digits,
        /// `-` and `_`).
        name: String,
        /// Folder to write NAME.yaml into.
        #[arg(long, default_value = ".")]
        out: PathBuf,
        /// Drive: `static`, or the duty `1/2`, `1/3` or `1/4`.
        #[arg(long, default_value = "static")]
        drive: String,
    },
    /// Print the JSON Schema of the layout format (docs/layout.schema.json).
    Schema,
    /// Print an intermediate form (for debugging and reviews): the resolved layout or
    /// the artwork, as Rust debug text.
    Dump {
        /// What to print.
        #[arg(value_enum)]
        what: DumpWhat,
        /// Layout file (YAML).
        layout: PathBuf,
        #[command(flatten)]
        input: InputArgs,
    },
}

/// Options about where input files may come from.
#[derive(clap::Args)]
struct InputArgs {
    /// A folder font files may also come from (fonts are otherwise read only from the
    /// layout's folder and below it); may be given more than once.
    #[arg(long, value_name = "DIR")]
    fonts_from: Vec<PathBuf>,
}

impl InputArgs {
    /// The input options, every folder checked to be one.
    fn options(&self) -> segmask::Result<segmask::spec::InputOptions> {
        for d in &self.fonts_from {
            if !d.is_dir() {
                return Err(command_line("--fonts-from", format!("`{}` is not a folder", d.display()), "an existing folder"));
            }
        }
        Ok(segmask::spec::InputOptions { font_dirs: self.fonts_from.clone() })
    }
}

fn command_line(key: &str, message: String, allowed: &str) -> segmask::Error {
    segmask::Error::input(InputProblem::on_command_line(key, message, allowed))
}

/// `--out` must be a folder or not exist yet.
fn check_out(out: &Path) -> segmask::Result<()> {
    match std::fs::metadata(out) {
        Ok(m) if !m.is_dir() => {
            Err(command_line("--out", format!("`{}` exists and is not a folder", out.display()), "a folder, or a path to create one at"))
        }
        _ => Ok(()),
    }
}

/// How `check` prints.
#[derive(Clone, Copy, PartialEq, clap::ValueEnum)]
enum Format {
    /// Compiler-style diagnostics on standard error.
    Text,
    /// One JSON document on standard output.
    Json,
}

/// Intermediate forms `dump` can print.
#[derive(Clone, Copy, clap::ValueEnum)]
enum DumpWhat {
    /// The resolved layout (all lengths in mm, defaults filled).
    Layout,
    /// The artwork: every polygon with its layer, role and net, and the intent.
    Artwork,
}

/// Runs the command line and returns the process exit code.
pub fn run() -> ExitCode {
    let cli = Cli::parse();
    let result = match cli.command {
        Command::Build { layout, out, masks_despite_errors, date, timings, png_dpi, input, lock_wait } => {
            build(&layout, &out, masks_despite_errors, date, timings, png_dpi, &input, lock_wait)
        }
        Command::Check { layout, format: Format::Text, input } => check(&layout, &input),
        Command::Check { layout, format: Format::Json, input } => check_json(&layout, &input),
        Command::Show { layout, text, on, out, dpi, input, lock_wait } => {
            show(&layout, &text, &on, &out, dpi, &input, lock_wait)
        }
        Command::Dump { what, layout, input } => dump(what, &layout, &input),
        Command::Watch { layout, out, masks_despite_errors, png_dpi, input } => {
            watch(&layout, &out, masks_despite_errors, png_dpi, &input)
        }
        Command::New { name, out, drive } => new(&name, &out, &drive),
        Command::Schema => console::out(segmask::spec::layout_schema().trim_end())
            .map(|_| ExitCode::SUCCESS)
            .map_err(|e| segmask::Error::io("standard output", e)),
    };
    match result {
        Ok(code) => code,
        Err(e) => {
            console::err(&e.to_string());
            ExitCode::from(2)
        }
    }
}

#[allow(clippy::too_many_arguments)]
fn build(
    layout: &Path,
    out: &Path,
    masks: bool,
    date: Option<String>,
    timings: bool,
    png_dpi: f32,
    input: &InputArgs,
    lock_wait: u64,
) -> segmask::Result<ExitCode> {
    check_dpi("--png-dpi", png_dpi)?;
    let date = date.unwrap_or_else(|| chrono::Local::now().format("%Y-%m-%d").to_string());
    segmask::emit::check_date(&date)?;
    check_out(out)?;
    let opts = segmask::emit::EmitOptions { date, masks_despite_errors: masks, png_dpi };
    let built = build_and_write(layout, out, &opts, &input.options()?, lock_wait, Verbosity::Build { timings })?;
    Ok(exit_for(&built.findings))
}

/// What a build prints besides the findings.
#[derive(Clone, Copy)]
enum Verbosity {
    /// `build`: the counts, every file written, the stage times if asked for.
    Build {
        /// Print the time each stage took.
        timings: bool,
    },
    /// `watch`: nothing more (it prints its own line per build).
    Watch,
}

/// Builds `layout`, prints its findings, writes its files into `out` as one set and says
/// what was written; used by `build` and by every build of `watch`.
fn build_and_write(
    layout: &Path,
    out: &Path,
    opts: &segmask::emit::EmitOptions,
    input: &segmask::spec::InputOptions,
    lock_wait: u64,
    verbosity: Verbosity,
) -> segmask::Result<Built> {
    let built = segmask::pipeline::build_layout_file_with(layout, input)?;
    let mut stages = built.timings.clone();
    print_diagnostics(layout, &built);
    let watching = matches!(verbosity, Verbosity::Watch);
    if !watching {
        print_counts(&built);
    }
    let t = std::time::Instant::now();
    let files = segmask::emit::render_outputs_planned(&built.artwork, &built.findings, &built.plan, opts)?;
    stages.push(("emit", t.elapsed()));
    let t = std::time::Instant::now();
    let write = segmask::emit::WriteOptions { lock_wait: std::time::Duration::from_secs(lock_wait) };
    segmask::emit::write_build_set(out, &segmask::emit::file_stem(&built.artwork.name), &files, &write)?;
    stages.push(("write", t.elapsed()));
    if watching {
        return Ok(built);
    }
    for f in &files {
        console::err(&format!("wrote {}", out.join(&f.name).display()));
    }
    if let Verbosity::Build { timings: true } = verbosity {
        // Every stage, the writers and the writing of the set included, after the files
        // they timed.
        for (stage, d) in &stages {
            console::err(&format!("time {stage:>9}: {:8.3} s", d.as_secs_f64()));
        }
    }
    if segmask::emit::masks_withheld(&built.findings, opts) {
        console::err("films and GDSII withheld while rule errors stand (pass --masks-despite-errors to write them anyway)");
    }
    Ok(built)
}

/// `watch`: a build now and after every save, each ending in one line with the counts;
/// a save that does not read prints its problems and writes nothing.
fn watch(layout: &Path, out: &Path, masks: bool, png_dpi: f32, input: &InputArgs) -> segmask::Result<ExitCode> {
    check_dpi("--png-dpi", png_dpi)?;
    check_out(out)?;
    let input = input.options()?;
    let dir = layout.parent().unwrap_or(Path::new(".")).to_path_buf();
    let fonts = std::cell::RefCell::new(Vec::<PathBuf>::new());
    let watched = || std::iter::once(layout.to_path_buf()).chain(fonts.borrow().iter().map(|f| dir.join(f))).collect();
    let build = || {
        let t = std::time::Instant::now();
        let date = chrono::Local::now().format("%Y-%m-%d").to_string();
        let opts = segmask::emit::EmitOptions { date, masks_despite_errors: masks, png_dpi };
        let clock = chrono::Local::now().format("%H:%M:%S");
        match build_and_write(layout, out, &opts, &input, 60, Verbosity::Watch) {
            Ok(built) => {
                *fonts.borrow_mut() = built.layout.extra_fonts.iter().map(|f| f.path.clone()).collect();
                let errors = segmask::finding::count(&built.findings, Severity::Error);
                let warnings = segmask::finding::count(&built.findings, Severity::Warning);
                console::err(&format!(
                    "[{clock}] built {}: {errors} error(s), {warnings} warning(s) in {:.2} s; watching {} for changes",
                    built.layout.name,
                    t.elapsed().as_secs_f64(),
                    layout.display()
                ));
            }
            Err(e) => {
                console::err(&e.to_string());
                console::err(&format!("[{clock}] not built: {} left as it was; watching {} for changes", out.display(), layout.display()));
            }
        }
    };
    crate::watch::watch(watched, build)
}

/// `new`: writes the starter layout, refusing to replace a file.
fn new(name: &str, out: &Path, drive: &str) -> segmask::Result<ExitCode> {
    let drive = match drive {
        "static" => segmask::spec::StarterDrive::Static,
        "1/2" => segmask::spec::StarterDrive::Duty(2),
        "1/3" => segmask::spec::StarterDrive::Duty(3),
        "1/4" => segmask::spec::StarterDrive::Duty(4),
        other => return Err(command_line("--drive", format!("`{other}` is not a drive the starter is written for"), "static, 1/2, 1/3, 1/4")),
    };
    if name.is_empty() || name.len() > segmask::spec::limits::MAX_NAME_CHARS || !name.chars().all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_') {
        return Err(command_line("NAME", format!("`{name}` is not a layout name"), "1 to 64 letters, digits, `-` and `_`"));
    }
    if !out.is_dir() {
        return Err(command_line("--out", format!("`{}` is not a folder", out.display()), "an existing folder"));
    }
    let path = out.join(format!("{name}.yaml"));
    let text = segmask::spec::starter_layout(name, drive);
    // create_new: never replaces a file, even one that appears between a check and the write.
    let mut file = match std::fs::OpenOptions::new().write(true).create_new(true).open(&path) {
        Ok(f) => f,
        Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => {
            return Err(command_line(
                "NAME",
                format!("`{}` already exists; segmask new does not replace a file", path.display()),
                "a name whose .yaml file is not there yet, or another --out folder",
            ));
        }
        Err(e) => return Err(segmask::Error::io(&path, e)),
    };
    std::io::Write::write_all(&mut file, text.as_bytes()).map_err(|e| segmask::Error::io(&path, e))?;
    console::err(&format!("wrote {}; build it with: segmask build {} --out out", path.display(), path.display()));
    Ok(ExitCode::SUCCESS)
}

fn check(layout: &Path, input: &InputArgs) -> segmask::Result<ExitCode> {
    let built = segmask::pipeline::build_layout_file_with(layout, &input.options()?)?;
    print_findings(layout, &built);
    Ok(exit_for(&built.findings))
}

/// `check --format json`: one document on standard output whatever happens, input
/// problems included (exit 2 for them, as in text).
fn check_json(layout: &Path, input: &InputArgs) -> segmask::Result<ExitCode> {
    let built = input.options().and_then(|o| segmask::pipeline::build_layout_file_with(layout, &o));
    let (doc, code) = match &built {
        Ok(b) => {
            let elements: Vec<_> = b.findings.iter().map(|f| segmask::finding_lines::elements_of(b, f)).collect();
            (segmask::emit::check_json::render_check(layout, &b.layout.name, &b.findings, &elements)?, exit_for(&b.findings))
        }
        Err(e) => (segmask::emit::check_json::render_failure(layout, e)?, ExitCode::from(2)),
    };
    let text = String::from_utf8(doc).map_err(|e| segmask::Error::Bug(format!("check JSON: {e}")))?;
    console::out(text.trim_end()).map_err(|e| segmask::Error::io("standard output", e))?;
    Ok(code)
}

fn show(
    layout: &Path,
    text: &str,
    on: &[String],
    out: &Path,
    dpi: f32,
    input: &InputArgs,
    lock_wait: u64,
) -> segmask::Result<ExitCode> {
    check_dpi("--dpi", dpi)?;
    check_out(out)?;
    let built = segmask::pipeline::build_layout_file_with(layout, &input.options()?)?;
    print_findings(layout, &built);
    let art = &built.artwork;
    let shown = segmask::show::show(art, text, on)?;
    let what = if on.is_empty() { format!("\"{text}\"") } else { format!("\"{text}\" with {}", on.join(", ")) };
    let svg = segmask::emit::show_svg::render_show_svg(&art.name, &art.window, &shown.visible, &what);
    let png = segmask::emit::show_svg::render_png(&svg, dpi)?;
    let stem = segmask::emit::file_stem(&art.name);
    let files = [
        segmask::emit::OutputFile { name: format!("{stem}.show.svg"), bytes: svg },
        segmask::emit::OutputFile { name: format!("{stem}.show.png"), bytes: png },
    ];
    let write = segmask::emit::WriteOptions { lock_wait: std::time::Duration::from_secs(lock_wait) };
    segmask::emit::write_set(out, &files, &write)?;
    for f in &files {
        console::err(&format!("wrote {}", out.join(&f.name).display()));
    }
    Ok(exit_for(&built.findings))
}

/// A resolution option must lie in the range the rasteriser is used for.
fn check_dpi(flag: &str, dpi: f32) -> segmask::Result<()> {
    if dpi.is_finite() && (10.0..=4800.0).contains(&dpi) {
        return Ok(());
    }
    Err(command_line(flag, format!("{dpi} dots per inch is outside the range drawn"), "10 to 4800"))
}

fn dump(what: DumpWhat, layout: &Path, input: &InputArgs) -> segmask::Result<ExitCode> {
    let opts = input.options()?;
    let text = match what {
        DumpWhat::Layout => format!("{:#?}", segmask::spec::load_layout_with(layout, &opts)?),
        DumpWhat::Artwork => format!("{:#?}", segmask::pipeline::build_layout_file_with(layout, &opts)?.artwork),
    };
    console::out(&text).map_err(|e| segmask::Error::io("standard output", e))?;
    Ok(ExitCode::SUCCESS)
}

fn print_findings(layout: &Path, built: &Built) {
    print_diagnostics(layout, built);
    print_counts(built);
}

fn print_diagnostics(layout: &Path, built: &Built) {
    for f in &built.findings {
        console::err(&segmask::emit::diagnostic(layout, f));
    }
}

fn print_counts(built: &Built) {
    let errors = segmask::finding::count(&built.findings, Severity::Error);
    let warnings = segmask::finding::count(&built.findings, Severity::Warning);
    console::err(&format!("{}: {errors} error(s), {warnings} warning(s)", built.layout.name));
}

fn exit_for(findings: &[Finding]) -> ExitCode {
    if findings.iter().any(|f| f.severity == Severity::Error) { ExitCode::from(1) } else { ExitCode::SUCCESS }
}
