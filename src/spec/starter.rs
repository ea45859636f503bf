//! The starter layout `segmask new` writes: a small clock-style display with every
//! common key written out and a comment on each, for a designer to edit.
//!
//! Takes a name and a drive, gives the YAML text. The text builds with no error and no
//! warning at every drive it offers (tests/cli/daily_loop.rs builds each one).

/// Drives the starter layout can be written for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StarterDrive {
    /// One common, one pad per element.
    Static,
    /// Multiplexed at 1/2, 1/3 or 1/4 duty, bias 1/3.
    Duty(u32),
}

impl StarterDrive {
    /// The `drive:` value written.
    fn yaml(self) -> String {
        match self {
            StarterDrive::Static => "static".into(),
            StarterDrive::Duty(n) => format!("{{duty: 1/{n}, bias: 1/3}}"),
        }
    }
}

const TEMPLATE: &str = include_str!("starter.yaml");

/// The starter layout named `name` (letters, digits, `-` and `_`: checked by the caller
/// like any layout name) for `drive`.
pub fn starter_layout(name: &str, drive: StarterDrive) -> String {
    TEMPLATE.replace("{{NAME}}", name).replace("{{DRIVE}}", &drive.yaml())
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every drive's starter reads and resolves (the full build is in the CLI tests).
    #[test]
    fn starter_resolves_at_every_drive() {
        for d in [StarterDrive::Static, StarterDrive::Duty(2), StarterDrive::Duty(3), StarterDrive::Duty(4)] {
            let text = starter_layout("my-panel", d);
            assert!(!text.contains("{{"), "{text}");
            let l = crate::spec::parse_layout(&text, std::path::Path::new("my-panel.yaml")).unwrap_or_else(|e| panic!("{d:?}: {e}"));
            assert_eq!(l.name, "my-panel");
            assert_eq!(l.digits[0].count, 4);
        }
    }
}
