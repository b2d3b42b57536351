//! The `stackwake` binary: parses arguments, calls the library's commands, prints, and maps
//! the outcome to an exit code: 0 all checks pass, 1 the analysis ran and a check fails,
//! 2 error (bad input, unwritable output, solver refusal).

use std::path::PathBuf;
use std::process::ExitCode;

use clap::{Parser, Subcommand};
use stackwake::commands::{self, CommandReport};
use stackwake::modal::ModalOptions;

/// Vortex-shedding lock-in screening of tall reinforced-concrete chimneys (screening tool:
/// results must be checked by a licensed engineer against the local code and National Annex).
#[derive(Debug, Parser)]
#[command(name = "stackwake", version, about)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Debug, Subcommand)]
enum Command {
    /// The main job: modes of every stage and the vortex-shedding checks, all outputs.
    Check {
        /// Case file (TOML); the built-in invented demo when omitted.
        case: Option<PathBuf>,
        /// Output folder.
        #[arg(long, default_value = "stackwake-out")]
        out: PathBuf,
        /// Minimum number of beam elements (default: enough for < 0.01 % on the modes).
        #[arg(long)]
        elements: Option<usize>,
    },
    /// Design sweep: analyse a full grid of case-file values (like `check` for each variant),
    /// write sweep.csv and, for two or more keys, the lock-in map sweep_map.svg.
    Sweep {
        /// Case file (TOML).
        case: PathBuf,
        /// KEY=FROM:TO:STEPS, KEY a case-file key path (e.g. shell.stations[2].wall_m);
        /// STEPS values evenly spaced, ends included. Repeat for a grid.
        #[arg(long = "vary", required = true)]
        vary: Vec<String>,
        /// Output folder.
        #[arg(long, default_value = "stackwake-out")]
        out: PathBuf,
    },
    /// Natural frequencies and mode shapes of every construction stage.
    Modes {
        /// Case file (TOML); the built-in invented demo when omitted.
        case: Option<PathBuf>,
        /// Output folder.
        #[arg(long, default_value = "stackwake-out")]
        out: PathBuf,
        /// Number of modes per stage.
        #[arg(long, default_value_t = 5)]
        modes: usize,
        /// Minimum number of beam elements (default: enough for < 0.01 % on the modes).
        #[arg(long)]
        elements: Option<usize>,
    },
}

fn check_range(option: &str, value: usize, lo: usize, hi: usize) -> anyhow::Result<()> {
    if value < lo || value > hi {
        return Err(stackwake::error::Error::Usage {
            option: option.into(),
            value: value.to_string(),
            rule: format!("must be between {lo} and {hi}"),
        }
        .into());
    }
    Ok(())
}

fn run(cli: Cli) -> anyhow::Result<CommandReport> {
    match cli.command {
        Command::Check {
            case,
            out,
            elements,
        } => {
            if let Some(n) = elements {
                check_range("--elements", n, 1, 200_000)?;
            }
            Ok(commands::check::run(
                case.as_deref(),
                &out,
                commands::check::CheckOptions {
                    min_elements: elements,
                },
            )?)
        }
        Command::Sweep { case, vary, out } => Ok(commands::sweep::run(&case, &vary, &out)?),
        Command::Modes {
            case,
            out,
            modes,
            elements,
        } => {
            check_range("--modes", modes, 1, 20)?;
            if let Some(n) = elements {
                check_range("--elements", n, 1, 200_000)?;
            }
            Ok(commands::modes::run(
                case.as_deref(),
                &out,
                ModalOptions {
                    modes,
                    min_elements: elements,
                },
            )?)
        }
    }
}

fn main() -> ExitCode {
    std::panic::set_hook(Box::new(|info| {
        eprintln!("stackwake: internal error (this is a bug; please report it with the case file): {info}");
        std::process::exit(2);
    }));
    let cli = match Cli::try_parse() {
        Ok(cli) => cli,
        Err(e) => {
            let code = if e.use_stderr() { 2 } else { 0 };
            let _ = e.print();
            return ExitCode::from(code);
        }
    };
    match run(cli) {
        Ok(report) => {
            print!("{}", report.stdout);
            for w in &report.warnings {
                eprintln!("warning: {w}");
            }
            if let Some(first) = report.files.first() {
                if let Some(dir) = first.parent() {
                    println!("wrote {} files to {}", report.files.len(), dir.display());
                }
            }
            ExitCode::from(if report.check_failed { 1 } else { 0 })
        }
        Err(e) => {
            eprintln!("error: {e:#}");
            ExitCode::from(2)
        }
    }
}
