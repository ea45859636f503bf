//! The bounded run of the fuzz harness (examples/fuzz/, docs/fuzzing.md): a fixed set of
//! seeded mutations of the demo layouts through the spec stage, and a few through the
//! whole pipeline, in this process. Any panic, and any error that is a bug rather than
//! a located input problem, fails the test. The long run is the example's.

use crate::mutate;
use segmask::Error;
use std::path::Path;

/// Cases through the spec stage, and through the whole pipeline.
const SPEC_CASES: u64 = 2000;
const PIPELINE_CASES: u64 = 4;

fn demos() -> Vec<(std::path::PathBuf, String)> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("demo-layouts");
    let mut v: Vec<_> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "yaml"))
        .map(|p| (p.clone(), std::fs::read_to_string(&p).unwrap()))
        .collect();
    v.sort();
    v
}

/// A spec-stage result is fine when it is a layout or located input problems.
fn check_result(r: &segmask::Result<segmask::layout::Layout>, seed: u64) {
    match r {
        Ok(_) => {}
        Err(Error::Input(problems)) => {
            assert!(!problems.is_empty(), "seed {seed}: empty problem list");
            for p in problems {
                assert!(!p.message.is_empty(), "seed {seed}: {p:?}");
            }
        }
        Err(e) => panic!("seed {seed}: not an input problem: {e}"),
    }
}

#[test]
fn seeded_mutations_never_panic() {
    let demos = demos();
    let (mut accepted, mut refused) = (0, 0);
    for seed in 0..SPEC_CASES {
        let (path, text) = &demos[seed as usize % demos.len()];
        let bytes = mutate::mutate(text, seed, false);
        // The reader's own checks (UTF-8, BOM) come before parse_layout; mirror them.
        let Ok(text) = std::str::from_utf8(&bytes) else { continue };
        let r = std::panic::catch_unwind(|| segmask::spec::parse_layout(text, path))
            .unwrap_or_else(|_| panic!("seed {seed}: spec stage panicked on:\n{text}"));
        check_result(&r, seed);
        if r.is_ok() { accepted += 1 } else { refused += 1 }
    }
    // The mutations must reach both outcomes, or the run tests little.
    assert!(accepted > 50 && refused > 500, "accepted {accepted}, refused {refused}");
    let minimal = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/good/minimal.yaml");
    let text = std::fs::read_to_string(&minimal).unwrap();
    let mut built = 0;
    for seed in 0..PIPELINE_CASES * 100 {
        if built == PIPELINE_CASES {
            break;
        }
        let bytes = mutate::mutate(&text, 7000 + seed, true);
        let Ok(layout) = segmask::spec::parse_layout(std::str::from_utf8(&bytes).unwrap(), &minimal) else { continue };
        built += 1;
        match std::panic::catch_unwind(|| segmask::pipeline::build_layout(layout)) {
            Ok(Ok(_)) | Ok(Err(Error::Input(_))) => {}
            Ok(Err(e)) => panic!("seed {seed}: {e}"),
            Err(_) => panic!("seed {seed}: pipeline panicked on:\n{}", String::from_utf8_lossy(&bytes)),
        }
    }
    assert_eq!(built, PIPELINE_CASES);
}
