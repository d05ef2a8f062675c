//! A small, strict argument reader: `--name value` pairs and positional words, with every
//! problem reported as one line that names the argument and what it accepts.

use doubleprime::error::{require_in, InputError};
use std::collections::BTreeMap;
use std::fmt;

/// Why a command line was refused.
#[derive(Debug)]
#[allow(dead_code)] // `Inputs` and `File` serve the scenario subcommands.
pub enum CliError {
    /// The command line's shape is wrong (unknown flag, missing value).
    Usage(String),
    /// A value is out of its valid range.
    Input(InputError),
    /// Several scenario fields are wrong at once (one line, `;`-separated).
    Inputs(Vec<InputError>),
    /// A file could not be read or parsed.
    File(String),
}

impl fmt::Display for CliError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            CliError::Usage(text) | CliError::File(text) => write!(f, "{text}"),
            // A command-line field is a flag: show it as the user typed it.
            CliError::Input(error) => write!(
                f,
                "--{} = {} is not accepted: valid is {}",
                error.field.replace('_', "-"),
                error.value,
                error.valid
            ),
            CliError::Inputs(errors) => {
                let lines: Vec<String> = errors.iter().map(ToString::to_string).collect();
                write!(f, "{}", lines.join("; "))
            }
        }
    }
}

impl From<InputError> for CliError {
    fn from(error: InputError) -> Self {
        CliError::Input(error)
    }
}

/// Parsed flags and positional words of one subcommand.
pub struct Args {
    flags: BTreeMap<String, String>,
    /// Words that are not flags, in order.
    pub positional: Vec<String>,
}

impl Args {
    /// Split `rest` into flags (`--name value`) and positional words; refuse flags not in `known`.
    pub fn parse(rest: &[String], known: &[&str]) -> Result<Self, CliError> {
        let mut flags = BTreeMap::new();
        let mut positional = Vec::new();
        let mut words = rest.iter();
        while let Some(word) = words.next() {
            if let Some(name) = word.strip_prefix("--") {
                if !known.contains(&name) {
                    let list: Vec<String> = known.iter().map(|k| format!("--{k}")).collect();
                    return Err(CliError::Usage(format!("unknown option --{name}; accepted: {}", list.join(" "))));
                }
                let Some(value) = words.next() else {
                    return Err(CliError::Usage(format!("--{name} needs a value")));
                };
                flags.insert(name.to_string(), value.clone());
            } else {
                positional.push(word.clone());
            }
        }
        Ok(Self { flags, positional })
    }

    /// The raw text of a flag, if given.
    pub fn text(&self, name: &str) -> Option<&str> {
        self.flags.get(name).map(String::as_str)
    }

    /// A number flag, if given, checked against `min..=max`. Accepts a decimal comma too.
    pub fn number(&self, name: &str, min: f64, max: f64) -> Result<Option<f64>, CliError> {
        let Some(text) = self.text(name) else {
            return Ok(None);
        };
        let field = name.replace('-', "_");
        let value: f64 = text.trim().replace(',', ".").parse().map_err(|_| {
            CliError::Input(InputError::new(&field, format!("{text:?}"), doubleprime::error::range_text(min, max)))
        })?;
        Ok(Some(require_in(&field, value, min, max)?))
    }

    /// A number flag that must be given.
    pub fn required_number(&self, name: &str, min: f64, max: f64) -> Result<f64, CliError> {
        self.number(name, min, max)?.ok_or_else(|| {
            CliError::Usage(format!("--{name} is required ({})", doubleprime::error::range_text(min, max)))
        })
    }

    /// Refuse positional words beyond `count`.
    pub fn at_most_positional(&self, count: usize, what: &str) -> Result<(), CliError> {
        if self.positional.len() > count {
            return Err(CliError::Usage(format!("unexpected argument `{}`; expected {what}", self.positional[count])));
        }
        Ok(())
    }
}
