//! `segmask schema`: the committed docs/layout.schema.json is what the command prints,
//! and the schema, read by the `jsonschema` package from PyPI (an independent validator
//! of JSON Schema draft 2020-12, json-schema.org), accepts every demo layout and refuses
//! every bad layout of tests/fixtures/bad/ that segmask's first, raw reading refuses
//! (an unknown key, a value of the wrong shape). The layouts are turned into JSON
//! instances with serde_yaml, the YAML reader segmask itself uses, so both read the same
//! values; tests/reference/check_schema.py validates them all in one Python run.

use serde_json::{Value, json};
use std::path::{Path, PathBuf};
use std::process::Command;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn schema_output() -> String {
    let o = Command::new(env!("CARGO_BIN_EXE_segmask")).arg("schema").output().unwrap();
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    String::from_utf8(o.stdout).unwrap()
}

#[test]
fn committed_schema_is_the_command_output() {
    let committed = std::fs::read_to_string(root().join("docs/layout.schema.json")).unwrap();
    assert!(
        committed == schema_output(),
        "docs/layout.schema.json is stale: run `cargo run -- schema > docs/layout.schema.json`"
    );
}

/// Bad layouts the schema refuses: segmask's raw read (serde, src/spec/raw.rs) refuses
/// them too, each for the reason given.
const SCHEMA_ERRORS: &[(&str, &str)] = &[
    ("unknown-key", "`heigth` is no key of a digit group"),
    ("wrong-type", "`glass` is a number where a mapping belongs"),
    ("merge-key", "`<<` is no key of `glass.back` (segmask names it a merge key, which it does not take)"),
    ("nesting-block-40", "`mixture` is a list where a mapping belongs (segmask stops it earlier, at its depth)"),
    ("nesting-flow-40", "`mixture` is a list where a mapping belongs (segmask stops it earlier, at its depth)"),
    ("bad-point", "a point of one coordinate: the raw read keeps it for the resolver to report, and the schema, which can say a point has two, refuses it"),
];

/// Bad layouts the schema takes, grouped by why it does: their fault is in what a value
/// means, not in the document's shape, and only the resolver and the checks after it see
/// it (segmask reports each with file, line and key; tests/cli/bad_layouts.rs).
const SCHEMA_TAKES: &[(&str, &[&str])] = &[
    (
        "a repeated key: the raw read refuses it, but in JSON's data model (RFC 8259, section 4) a mapping holds one value per name, so no schema sees the repeat",
        &[
            "duplicate-key",
        ],
    ),
    (
        "a value out of range, not finite, of a unit or word segmask does not know, or a name too long or not allowed: a unit or a word is text to the schema, and its meaning and range depend on the key, which the resolver reads",
        &[
            "bad-drive", "bad-name", "bar-count-nan", "bar-infinite-thickness",
            "bar-negative-length", "bar-too-many-steps", "birefringence-inf", "bus-point-1e300",
            "cell-gap-nan", "copies-1e12", "digit-count-1e9", "first-pin-near-2-32",
            "first-pin-text-huge", "fixed-pin-huge", "fixed-seg-huge", "frame-rate-unit",
            "gds-layer-1e12", "gds-layer-range", "glass-1e20", "glass-1e308", "glass-over-a-metre",
            "group-name-too-long", "implausible-cell-gap", "legend-5000-chars", "legend-65-chars",
            "marks-size-5-m", "name-231-chars", "name-255-chars", "negative-gap",
            "negative-registration", "negative-width", "net-name-too-long", "origin-1e300",
            "pads-count-1500", "pads-count-1e9", "path-10001-chars", "pitch-inf-text",
            "rectangle-width-inf", "reserved-net-name", "ring-centre-1e300", "seal-width-nan",
            "slant-1e300", "slant-nan", "slant-too-steep", "tolerance-inf", "unknown-gds-layer",
            "unknown-process", "unknown-style", "voltage-nan", "wavelength-1e308",
            "wavelength-out-of-range", "window-x-minus-inf", "wrong-unit",
        ],
    ),
    (
        "more items than segmask takes (src/spec/limits.rs): the limits are segmask's guards, kept in one place, not part of the format",
        &[
            "bars-51", "bus-1001-points", "buses-201", "digit-groups-21", "digits-over-200",
            "fonts-17", "icons-401", "legends-201", "pads-needed-over-1000", "polygon-1001-points",
        ],
    ),
    (
        "a key missing, a key that excludes another, or a fault between keys or elements (overlaps, fit, nets, pins, the window and the seal): the raw read takes every key as optional so that the resolver can report all problems at once, and relations between values are the resolver's and the checks'",
        &[
            "back-outside-front", "bad-bias", "bad-fixed-pin", "bar-arc-start-1e9",
            "bar-arc-too-tight", "bar-gap-below-rule", "bar-no-path", "bar-outside-window",
            "bar-over-digit", "bar-step-net-twice", "bar-wedge-on-line", "bus-one-point",
            "bus-unknown-net", "decimal-point-index", "default-gap-wider-than-stroke", "digit-outside-window", "digit-over-icon",
            "duplicate-net", "fill-port-in-corner", "fill-port-on-pad-side", "film-below-process",
            "fixed-com-beyond-duty", "fixed-pin-off-row", "fixed-pin-twice",
            "fixed-unknown-element", "fourteen-gap-too-narrow", "gap-finer-than-film", "gauge-parts-touch", "gauge-unknown", "glass-grid-too-big",
            "icon-two-shapes", "lead-finer-than-film", "legend-wider-than-window", "missing-key", "no-ledge",
            "overlapping-digits", "overlapping-groups", "pads-count-too-small", "pads-dont-fit",
            "panel-lane-wide", "panel-substrate-small", "ring-inner", "saturation-below-threshold",
            "stroke-too-heavy", "thin-marks", "window-outside-seal", "no-mark-room",
        ],
    ),
    (
        "a font file that is missing, not a file, or outside the layout's folder: what is on disk is no part of the document",
        &[
            "font-climbs-out", "font-dev-zero", "font-is-folder", "font-outside-folder",
            "missing-font",
        ],
    ),
];

/// Bad layouts that are no JSON instance to validate: YAML that does not read (a syntax
/// error, a tab in the indentation, bytes that are not UTF-8, a second document), aliases
/// that expand past serde_yaml's limit, and an integer beyond 64 bits, which a JSON
/// number as serde_json holds it cannot carry. The YAML reader refuses them before any
/// schema could apply.
const NOT_AN_INSTANCE: &[&str] = &[
    "syntax-error", "tab-indentation", "invalid-utf8", "second-document", "alias-bomb",
    "glass-huge-integer",
];

/// The layout as a JSON instance, or `None` when serde_yaml cannot read it as one.
fn instance(path: &Path) -> Option<Value> {
    let text = std::fs::read_to_string(path).ok()?;
    serde_yaml::from_str::<Value>(&text).ok()
}

fn yaml_files(dir: &Path) -> Vec<PathBuf> {
    let mut v: Vec<PathBuf> = std::fs::read_dir(dir)
        .unwrap()
        .filter_map(|e| Some(e.ok()?.path()))
        .filter(|p| p.extension().is_some_and(|x| x == "yaml"))
        .collect();
    v.sort();
    v
}

fn stem(p: &Path) -> String {
    p.file_stem().unwrap().to_string_lossy().into_owned()
}

#[test]
fn jsonschema_takes_every_demo_and_refuses_the_raw_read_errors() {
    let mut instances = Vec::new();
    for p in yaml_files(&root().join("demo-layouts")) {
        let doc = instance(&p).unwrap_or_else(|| panic!("{} does not read as YAML", p.display()));
        instances.push(json!({"name": format!("demo {}", stem(&p)), "doc": doc, "expect": "valid"}));
    }
    let mut unlisted: Vec<String> = Vec::new();
    for p in yaml_files(&root().join("tests/fixtures/bad")) {
        let name = stem(&p);
        let expect = if SCHEMA_ERRORS.iter().any(|(n, _)| *n == name) {
            "invalid"
        } else if SCHEMA_TAKES.iter().any(|(_, names)| names.contains(&name.as_str())) {
            "valid"
        } else if NOT_AN_INSTANCE.contains(&name.as_str()) {
            assert!(instance(&p).is_none(), "{name} reads as a JSON instance: list it by the schema's verdict");
            continue;
        } else {
            unlisted.push(name);
            continue;
        };
        let doc = instance(&p).unwrap_or_else(|| panic!("{name} does not read as YAML: list it in NOT_AN_INSTANCE"));
        instances.push(json!({"name": format!("bad {name}"), "doc": doc, "expect": expect}));
    }
    let dir = tempfile::tempdir().unwrap();
    let (schema, list) = (dir.path().join("layout.schema.json"), dir.path().join("instances.json"));
    std::fs::write(&schema, schema_output()).unwrap();
    std::fs::write(&list, serde_json::to_vec(&instances).unwrap()).unwrap();
    let o = Command::new(crate::reference::python())
        .arg(root().join("tests/reference/check_schema.py"))
        .arg(&schema)
        .arg(&list)
        .output()
        .unwrap();
    let text = format!("{}{}", String::from_utf8_lossy(&o.stdout), String::from_utf8_lossy(&o.stderr));
    println!("{text}");
    assert!(unlisted.is_empty(), "bad layouts in no list of tests/cli/schema.rs: {unlisted:?}");
    assert!(o.status.success(), "{text}");
}
