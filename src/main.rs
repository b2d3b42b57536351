//! The `stackwake` binary: parses arguments, calls the library's commands, prints, and maps
//! the outcome to an exit code: 0 every judged check passes, 1 the analysis ran and a check
//! fails, 2 error (bad input, unwritable output, solver refusal), 3 the analysis ran but
//! nothing was judged (no `[criteria]` given).

use std::path::PathBuf;
use std::process::ExitCode;

use clap::{CommandFactory, Parser, Subcommand};
use stackwake::commands::{self, CommandReport};
use stackwake::input::names::terminal_safe;
use stackwake::modal::ModalOptions;

/// Vortex-shedding lock-in screening of tall reinforced-concrete chimneys (screening tool:
/// results must be checked by a licensed engineer against the local code and National Annex).
#[derive(Debug, Parser)]
#[command(name = "stackwake", version, about, after_long_help = EXIT_CODES)]
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
    /// Write a fully commented starter case file (invented placeholder values).
    New {
        /// File to write.
        #[arg(default_value = "case.toml")]
        file: PathBuf,
        /// Replace the file if it exists.
        #[arg(long)]
        force: bool,
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
    /// Probabilistic screening: Monte Carlo over the case's [[uncertain]] inputs; writes
    /// risk.csv, summary.json, risk.html and its plots (a shard writes risk_partial.json).
    Risk {
        /// Case file (TOML) with [[uncertain]] entries.
        case: PathBuf,
        /// Number of samples of the whole run (all shards together).
        #[arg(long)]
        samples: u64,
        /// Seed of the sample streams (sample i is the same for every shard count).
        #[arg(long, default_value_t = 1)]
        seed: u64,
        /// Output folder.
        #[arg(long, default_value = "stackwake-out")]
        out: PathBuf,
        /// Also write risk_samples.csv (one row per sample, stage and mode).
        #[arg(long)]
        keep_samples: bool,
        /// Run only the K-th of N deterministic slices and write a partial result
        /// (combine with `risk-merge`).
        #[arg(long, value_name = "K/N")]
        shard: Option<String>,
        /// Also sample each mode's vortex utilisation M_Ed / M_Rd and fatigue damage of the
        /// bars (needs [reinforcement]; slower: a cracked-section solve per height).
        #[arg(long)]
        with_resistance: bool,
    },
    /// Combine the partial results of `risk --shard K/N` (one folder per shard) into the
    /// outputs of the unsharded run.
    RiskMerge {
        /// Shard output folders (each holding risk_partial.json).
        #[arg(required = true)]
        dirs: Vec<PathBuf>,
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
    /// Plans an aeroelastic wind-tunnel model from the case's [model] table, checks it by
    /// computation, and converts lab measurements on the model back to the prototype.
    Scale {
        /// Case file (TOML) with a [model] table.
        case: PathBuf,
        /// Output folder.
        #[arg(long, default_value = "stackwake-out")]
        out: PathBuf,
        /// Length scale k_l = prototype / model (overrides model.length_scale).
        #[arg(long)]
        length_scale: Option<f64>,
        /// The lab's measurements on the model (CSV: model_speed_m_s and any of
        /// tip_amplitude_m, strain, stress_pa, frequency_hz).
        #[arg(long)]
        measured: Option<PathBuf>,
        /// Minimum number of beam elements for both FE runs.
        #[arg(long)]
        elements: Option<usize>,
    },
    /// Print a shell completion script (e.g. `stackwake completions bash > stackwake.bash`).
    Completions {
        /// Shell to complete for.
        shell: clap_complete::Shell,
    },
}

/// The exit codes, shown by `--help`.
const EXIT_CODES: &str = "Exit codes:
  0  the analysis ran and every judged check passes
  1  the analysis ran and some check fails (a criterion is exceeded)
  2  error: bad input, unwritable output, solver refusal
  3  the analysis ran but nothing was judged (the case gives no [criteria]; `check` only)
`sweep` exits 0 when the grid ran (its verdicts are in sweep.csv); `risk` and `risk-merge`
exit 0 when the samples ran (the probabilities are in risk.csv).";

/// Largest `--elements` accepted.
const MAX_ELEMENTS: usize = 20_000;

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
        Command::New { file, force } => Ok(commands::new::run(&file, force)?),
        Command::Sweep { case, vary, out } => Ok(commands::sweep::run(&case, &vary, &out)?),
        Command::Risk {
            case,
            samples,
            seed,
            out,
            keep_samples,
            shard,
            with_resistance,
        } => {
            let shard = shard
                .as_deref()
                .map(commands::risk::parse_shard)
                .transpose()?;
            Ok(commands::risk::run(
                &case,
                &commands::risk::RiskOptions {
                    samples,
                    seed,
                    keep_samples,
                    shard,
                    with_resistance,
                },
                &out,
            )?)
        }
        Command::RiskMerge { dirs, out } => Ok(commands::risk::merge(&dirs, &out)?),
        Command::Modes {
            case,
            out,
            modes,
            elements,
        } => {
            check_range("--modes", modes, 1, 20)?;
            if let Some(n) = elements {
                // Beyond ~20000 elements the Sturm count that proves completeness loses its
                // precision (K's entries grow like EI/h^3) and stages would be refused.
                check_range("--elements", n, 1, MAX_ELEMENTS)?;
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
        Command::Scale {
            case,
            out,
            length_scale,
            measured,
            elements,
        } => {
            if let Some(n) = elements {
                check_range("--elements", n, 1, 200_000)?;
            }
            let options = commands::scale::ScaleOptions {
                length_scale,
                measured,
                min_elements: elements,
            };
            Ok(commands::scale::run(&case, &out, &options)?)
        }
        Command::Completions { shell } => {
            let mut script = Vec::new();
            clap_complete::generate(shell, &mut Cli::command(), "stackwake", &mut script);
            Ok(CommandReport {
                stdout: String::from_utf8_lossy(&script).into_owned(),
                ..CommandReport::default()
            })
        }
    }
}

/// The error and its causes, each cause shown once: library messages already quote their
/// I/O cause, so a cause whose text is already in the message is not repeated.
fn error_text(e: &anyhow::Error) -> String {
    let mut text = e.to_string();
    for cause in e.chain().skip(1) {
        let cause = cause.to_string();
        if !text.contains(&cause) {
            text.push_str(": ");
            text.push_str(&cause);
        }
    }
    text
}

fn main() -> ExitCode {
    stackwake::process::reuse_freed_blocks();
    // Ctrl-C and SIGTERM remove the staging folder of the run in progress before exiting.
    stackwake::report::staging::clean_up_on_signals();
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
            print!("{}", terminal_safe(&report.stdout));
            for w in &report.warnings {
                eprintln!("warning: {}", terminal_safe(w));
            }
            if let Some(first) = report.files.first() {
                if let Some(dir) = first.parent() {
                    println!(
                        "wrote {} files to {}",
                        report.files.len(),
                        terminal_safe(&dir.display().to_string())
                    );
                }
            }
            ExitCode::from(if report.check_failed {
                1
            } else if report.not_judged {
                3
            } else {
                0
            })
        }
        Err(e) => {
            eprintln!("error: {}", terminal_safe(&error_text(&e)));
            ExitCode::from(2)
        }
    }
}
