//! Fuzz harness on stable Rust: seeded mutations of the demo layouts through the spec
//! stage (in this process, every case) and through the whole pipeline (the real
//! `segmask check` in a child process, every `--pipeline-every`-th case), with a limit
//! on its processor time and its address space, and its peak memory recorded.
//!
//! ```sh
//! cargo build --release && cargo run --release --example fuzz -- --minutes 60 --seed 1
//! ```
//!
//! A failure is a panic in the spec stage, or a child that ends other than with exit
//! code 0, 1 or 2 (a panic gives 101, an abort 134 or a signal), that uses more than
//! `--timeout` seconds of processor time, or that peaks above 2 GiB. Each failure's input is saved to
//! `target/fuzz/failures/` with its seed; the run prints the counts at the end and
//! exits with 1 when anything failed. docs/fuzzing.md tells how to read the figures.

mod mutate;

use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

struct Args {
    minutes: f64,
    seed: u64,
    pipeline_every: u64,
    timeout: u64,
    cases: Option<u64>,
}

fn args() -> Result<Args, String> {
    let mut a = Args { minutes: 1.0, seed: 1, pipeline_every: 20, timeout: 120, cases: None };
    let mut it = std::env::args().skip(1);
    while let Some(k) = it.next() {
        let v = it.next().ok_or(format!("{k} needs a value"))?;
        let bad = format!("bad value for {k}: {v}");
        let whole = || v.parse::<u64>().map_err(|_| bad.clone());
        match k.as_str() {
            "--minutes" => a.minutes = v.parse().map_err(|_| bad.clone())?,
            "--seed" => a.seed = whole()?,
            "--pipeline-every" => a.pipeline_every = whole()?.max(1),
            "--timeout" => a.timeout = whole()?,
            "--cases" => a.cases = Some(whole()?),
            _ => return Err(format!("unknown option {k} (--minutes, --seed, --pipeline-every, --timeout, --cases)")),
        }
    }
    Ok(a)
}

/// Peak memory a child may reach before it counts as a failure, KiB.
const PEAK_LIMIT_KIB: i64 = 2 * 1024 * 1024;

fn main() {
    let a = match args() {
        Ok(a) => a,
        Err(e) => {
            eprintln!("{e}");
            std::process::exit(2);
        }
    };
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let exe = std::env::current_exe().ok().and_then(|e| Some(e.parent()?.parent()?.join("segmask")));
    let Some(exe) = exe.filter(|e| e.exists()) else {
        eprintln!("build the binary first: cargo build --release");
        std::process::exit(2);
    };
    let seeds = demo_texts(root);
    let work = root.join("target/fuzz");
    let failures = work.join("failures");
    std::fs::create_dir_all(&failures).expect("target/fuzz");
    let start = Instant::now();
    let limit = Duration::from_secs_f64(a.minutes * 60.0);
    let (mut cases, mut spec_ok, mut spec_refused, mut runs, mut failed) = (0u64, 0u64, 0u64, 0u64, 0u64);
    let mut codes = [0u64; 3];
    let (mut peak_kib, mut slowest) = (0i64, Duration::ZERO);
    std::panic::set_hook(Box::new(|_| {}));
    while start.elapsed() < limit && a.cases.is_none_or(|n| cases < n) {
        let case_seed = a.seed.wrapping_mul(1_000_003).wrapping_add(cases);
        let (name, text) = &seeds[(case_seed % seeds.len() as u64) as usize];
        let whole = cases % a.pipeline_every == 0;
        let bytes = mutate::mutate(text, case_seed, whole);
        let file = work.join(format!("case-{}.yaml", a.seed));
        std::fs::write(&file, &bytes).expect("write case");
        cases += 1;
        if cases % 500 == 0 {
            eprintln!("{cases} cases, {runs} pipeline runs, {failed} failures, {:.0} s", start.elapsed().as_secs_f64());
        }
        let spec = std::panic::catch_unwind(|| match std::str::from_utf8(&bytes) {
            Ok(t) => segmask::spec::parse_layout(t, &file).is_ok(),
            Err(_) => false,
        });
        match spec {
            Ok(true) => spec_ok += 1,
            Ok(false) => spec_refused += 1,
            Err(_) => {
                failed += 1;
                save(&failures, name, case_seed, &bytes, "spec stage panicked");
                continue;
            }
        }
        if !whole {
            continue;
        }
        runs += 1;
        match run_child(&exe, &file, Duration::from_secs(a.timeout)) {
            Ok((code, kib, took)) => {
                peak_kib = peak_kib.max(kib);
                slowest = slowest.max(took);
                if (0..=2).contains(&code) {
                    codes[code as usize] += 1;
                }
                if !(0..=2).contains(&code) || kib > PEAK_LIMIT_KIB {
                    failed += 1;
                    save(&failures, name, case_seed, &bytes, &format!("exit {code}, peak {} MiB", kib / 1024));
                }
            }
            Err(why) => {
                failed += 1;
                save(&failures, name, case_seed, &bytes, &why);
            }
        }
    }
    println!("fuzz: seed {}, {:.1} min", a.seed, start.elapsed().as_secs_f64() / 60.0);
    println!("cases: {cases} (spec stage accepted {spec_ok}, refused {spec_refused})");
    println!("pipeline runs: {runs} (exit 0: {}, 1: {}, 2: {})", codes[0], codes[1], codes[2]);
    println!("largest peak memory of a run: {} MiB; slowest run: {:.1} s", peak_kib / 1024, slowest.as_secs_f64());
    println!("failures: {failed} (inputs in {})", failures.display());
    std::process::exit(i32::from(failed > 0));
}

/// The demo layouts: (file name, text).
fn demo_texts(root: &Path) -> Vec<(String, String)> {
    let mut v: Vec<(String, String)> = std::fs::read_dir(root.join("demo-layouts"))
        .expect("demo-layouts")
        .filter_map(|e| {
            let p = e.ok()?.path();
            (p.extension()? == "yaml").then(|| Some((p.file_name()?.to_str()?.to_string(), std::fs::read_to_string(&p).ok()?)))?
        })
        .collect();
    v.sort();
    v
}

fn save(dir: &Path, name: &str, seed: u64, bytes: &[u8], why: &str) {
    let stem = format!("{}-{seed}", name.trim_end_matches(".yaml"));
    let _ = std::fs::write(dir.join(format!("{stem}.yaml")), bytes);
    let _ = std::fs::write(dir.join(format!("{stem}.why")), why);
    eprintln!("FAILURE {stem}: {why}");
}

/// Processor time (user + system) `pid` has used so far, from /proc/PID/stat (fields
/// 14 and 15, in clock ticks; Linux proc(5)); 0 where it cannot be read.
fn cpu_seconds(pid: i32) -> f64 {
    let Ok(stat) = std::fs::read_to_string(format!("/proc/{pid}/stat")) else { return 0.0 };
    // The command name (field 2) is in parentheses and may hold spaces: count after it.
    let Some(rest) = stat.rsplit_once(')').map(|(_, r)| r) else { return 0.0 };
    let f: Vec<&str> = rest.split_whitespace().collect();
    let ticks: f64 = [11, 12].iter().filter_map(|&i| f.get(i)?.parse::<f64>().ok()).sum();
    // SAFETY: sysconf only reads a constant.
    let hz = unsafe { libc::sysconf(libc::_SC_CLK_TCK) }.max(1) as f64;
    ticks / hz
}

/// Runs `segmask check FILE`; gives exit code (128 + signal when killed by one), peak
/// resident set in KiB and wall time, or why it counts as a hang.
fn run_child(exe: &PathBuf, file: &Path, timeout: Duration) -> Result<(i32, i64, Duration), String> {
    let mut cmd = Command::new(exe);
    cmd.arg("check").arg(file).stdout(Stdio::null()).stderr(Stdio::null());
    #[cfg(target_os = "linux")]
    {
        use std::os::unix::process::CommandExt as _;
        // SAFETY: only async-signal-safe setrlimit between fork and exec. A 4 GiB
        // address-space cap keeps a runaway case from taking the machine down with it.
        unsafe {
            cmd.pre_exec(|| {
                let lim = libc::rlimit { rlim_cur: 4 << 30, rlim_max: 4 << 30 };
                libc::setrlimit(libc::RLIMIT_AS, &lim);
                Ok(())
            });
        }
    }
    let start = Instant::now();
    let child = cmd.spawn().map_err(|e| format!("spawn: {e}"))?;
    let pid = child.id() as i32;
    loop {
        let mut status = 0;
        // SAFETY: plain libc calls on our own child's pid.
        let mut usage: libc::rusage = unsafe { std::mem::zeroed() };
        let r = unsafe { libc::wait4(pid, &mut status, libc::WNOHANG, &mut usage) };
        if r == pid {
            let code = if libc::WIFEXITED(status) { libc::WEXITSTATUS(status) } else { 128 + libc::WTERMSIG(status) };
            return Ok((code, usage.ru_maxrss, start.elapsed()));
        }
        // The limit is on the child's processor time, so that a machine busy with other
        // work does not pass for a hang; ten times the limit in wall time as a backstop.
        let cpu = cpu_seconds(pid);
        if cpu > timeout.as_secs_f64() || start.elapsed() > timeout * 10 {
            unsafe { libc::kill(pid, libc::SIGKILL) };
            unsafe { libc::waitpid(pid, &mut status, 0) };
            return Err(format!(
                "no end after {cpu:.0} s of processor time, {:.0} s of wall time (hang)",
                start.elapsed().as_secs_f64()
            ));
        }
        std::thread::sleep(Duration::from_millis(20));
    }
}
