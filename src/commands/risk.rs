//! `risk` and `risk-merge`: probabilistic screening over the case's `[[uncertain]]` inputs.
//!
//! `risk CASE --samples N [--seed S] [--out DIR] [--keep-samples] [--shard K/N]
//! [--with-resistance]` runs the samples (all of them, or the K-th of N deterministic
//! slices) on all cores with a progress bar on a terminal. Unsharded it writes risk.csv,
//! summary.json, risk.html and its plots (and risk_samples.csv with --keep-samples); a
//! shard writes `risk_partial.json` (the case's SHA-256, the settings and the exact
//! statistics of its slice) and, with --keep-samples, its rows of risk_samples.csv.
//! `risk-merge DIR... [--out DIR]` combines the shards of one run into exactly the files of
//! the unsharded run.
//!
//! `[[rank_correlation]]` pairs are read after the keys (a Gaussian copula, see
//! [`crate::risk::correlation`]); `--with-resistance` adds each mode's vortex utilisation
//! and fatigue damage (needs `[reinforcement]`).
//!
//! Keys are checked with the sweep's rules before any work; a distribution whose range
//! reaches a value the case-file rules refuse (for keys that keep the modes) is refused with
//! the rule's message, so every shortcut sample is a valid case.

use std::path::{Path, PathBuf};

use indicatif::{ProgressBar, ProgressStyle};

use crate::error::Error;
use crate::input::{self, keypath, rank_correlation, uncertain};
use crate::report::risk as out;
use crate::report::staging::Staging;
use crate::risk::run::{run_range, RowWriter};
use crate::risk::{
    self, role_of, Accumulator, Engine, InputInfo, ModeInfo, Partial, RiskHeader, Role,
    UncertainInput, C_LAT_FACTOR_KEY, MAX_SAMPLES, PARTIAL_FORMAT,
};
use crate::sweep::Vary;

use super::CommandReport;

/// Name of a shard's partial result.
pub const PARTIAL_FILE: &str = "risk_partial.json";
/// Name of the kept samples.
pub const SAMPLES_FILE: &str = "risk_samples.csv";

/// Options of `risk`.
#[derive(Debug, Clone)]
pub struct RiskOptions {
    pub samples: u64,
    pub seed: u64,
    pub keep_samples: bool,
    /// (K, N), 1 <= K <= N.
    pub shard: Option<(u64, u64)>,
    /// Also sample the resistance quantities (`--with-resistance`).
    pub with_resistance: bool,
}

/// Parses `K/N`.
pub fn parse_shard(arg: &str) -> Result<(u64, u64), Error> {
    let bad = |rule: &str| Error::Usage {
        option: "--shard".into(),
        value: arg.to_string(),
        rule: rule.to_string(),
    };
    let (k, n) = arg
        .split_once('/')
        .ok_or_else(|| bad("expected K/N, e.g. 3/8 (the 3rd of 8 slices)"))?;
    let k: u64 = k
        .trim()
        .parse()
        .map_err(|_| bad("K is not a whole number"))?;
    let n: u64 = n
        .trim()
        .parse()
        .map_err(|_| bad("N is not a whole number"))?;
    if n == 0 {
        return Err(bad("N must be at least 1"));
    }
    if k == 0 || k > n {
        return Err(bad(&format!("K must be between 1 and N = {n}")));
    }
    Ok((k, n))
}

fn usage(option: &str, value: impl ToString, rule: impl Into<String>) -> Error {
    Error::Usage {
        option: option.into(),
        value: value.to_string(),
        rule: rule.into(),
    }
}

fn invalid(label: &str, issues: Vec<input::issue::ValidationIssue>) -> Error {
    Error::Input(input::InputError::Invalid {
        label: label.to_string(),
        issues,
    })
}

/// Validates the entries against the case: key known, shortcut ranges valid.
fn inputs_of(
    table: &toml::Table,
    base_dir: &Path,
    label: &str,
    entries: &[uncertain::UncertainEntry],
) -> Result<Vec<UncertainInput>, Error> {
    let zones = table
        .get("shell")
        .and_then(|s| s.as_table())
        .is_some_and(|s| s.contains_key("zone"));
    let springs = table
        .get("base")
        .and_then(|b| b.as_table())
        .is_some_and(|b| {
            b.contains_key("rotational_stiffness_gnm_per_rad")
                || b.contains_key("lateral_stiffness_mn_per_m")
        });
    let mut inputs = Vec::new();
    for (i, e) in entries.iter().enumerate() {
        let path = format!("uncertain[{i}].key");
        let mid = e.distribution.sample(0.5);
        if e.key != C_LAT_FACTOR_KEY {
            let vary = Vary {
                key: e.key.clone(),
                from: mid,
                to: mid,
                steps: 1,
            };
            crate::commands::sweep::check_keys(table, std::slice::from_ref(&vary)).map_err(
                |err| {
                    let rule = match err {
                        Error::Usage { rule, .. } => rule,
                        other => other.to_string(),
                    };
                    invalid(
                        label,
                        vec![input::issue::ValidationIssue::new(
                            path.clone(),
                            format!("{:?}", e.key),
                            rule,
                        )],
                    )
                },
            )?;
        }
        let role = role_of(&e.key, risk::Scaling::of(zones, springs));
        let case_value = match role {
            Role::CLatFactor => 1.0,
            _ => match keypath::get_number(table, &e.key) {
                Ok(v) => v,
                Err(_)
                    if matches!(role, Role::StageStiffness(_) | Role::ShellStageStiffness(_)) =>
                {
                    1.0
                }
                Err(_) => f64::NAN,
            },
        };
        if matches!(
            role,
            Role::ElasticModulus
                | Role::StageStiffness(_)
                | Role::ShellModulus
                | Role::ShellStageStiffness(_)
        ) && (case_value.is_nan() || case_value <= 0.0)
        {
            return Err(invalid(
                label,
                vec![input::issue::ValidationIssue::new(
                    path,
                    format!("{:?}", e.key),
                    "the case's own value must be > 0 for frequencies to scale from it",
                )],
            ));
        }
        // The extreme samples: u = 2^-54 and 1 - 2^-54 (the smallest and largest uniform).
        let ends = [
            e.distribution.sample(risk::rng::bits_to_uniform(0)),
            e.distribution
                .sample(risk::rng::bits_to_uniform((1u64 << 53) - 1)),
        ];
        if role.keeps_modes() {
            for x in ends {
                if role == Role::CLatFactor {
                    if !(x >= 0.0 && x.is_finite()) {
                        return Err(invalid(
                            label,
                            vec![input::issue::ValidationIssue::new(
                                format!("uncertain[{i}]"),
                                format!("{x}"),
                                "the distribution reaches this c_lat factor; it must be >= 0: \
                                 truncate it (truncate_low = 0) or use lognormal",
                            )],
                        ));
                    }
                    continue;
                }
                let mut t = table.clone();
                let _ = keypath::insert_number(&mut t, &e.key, x);
                if let Err(err) = input::parse_case_table(t, base_dir, label) {
                    let why: Vec<String> = err.issues().iter().map(|i| i.to_string()).collect();
                    let why = if why.is_empty() {
                        err.to_string()
                    } else {
                        why.join("; ")
                    };
                    return Err(invalid(
                        label,
                        vec![input::issue::ValidationIssue::new(
                            format!("uncertain[{i}]"),
                            format!("{} = {x}", e.key),
                            format!(
                                "the distribution ({}) reaches this value, which the case \
                                 file refuses ({why}); truncate it (truncate_low / \
                                 truncate_high) or choose another distribution",
                                e.described
                            ),
                        )],
                    ));
                }
            }
        }
        inputs.push(UncertainInput {
            key: e.key.clone(),
            role,
            distribution: e.distribution,
            described: e.described.clone(),
            case_value,
        });
    }
    Ok(inputs)
}

fn progress_bar(n: u64) -> ProgressBar {
    if std::io::IsTerminal::is_terminal(&std::io::stderr()) {
        let b = ProgressBar::new(n);
        if let Ok(style) = ProgressStyle::with_template(
            "{bar:40} {pos}/{len} samples, {elapsed} elapsed, ~{eta} left",
        ) {
            b.set_style(style);
        }
        b
    } else {
        ProgressBar::hidden()
    }
}

/// Runs `risk`.
pub fn run(case_path: &Path, o: &RiskOptions, out_dir: &Path) -> Result<CommandReport, Error> {
    if o.samples == 0 || o.samples > MAX_SAMPLES {
        return Err(usage(
            "--samples",
            o.samples,
            format!("must be between 1 and {MAX_SAMPLES}"),
        ));
    }
    if let Some((_, n)) = o.shard {
        if n > o.samples {
            return Err(usage(
                "--shard",
                format!("{}/{n}", o.shard.map_or(0, |s| s.0)),
                format!("N must not exceed --samples = {}", o.samples),
            ));
        }
    }
    let label = case_path.display().to_string();
    let case = input::load_case(case_path)?;
    let table = input::read_case_table(case_path)?;
    let base_dir = case_path.parent().unwrap_or_else(|| Path::new(""));
    let entries = uncertain::read(&table).map_err(|issues| invalid(&label, issues))?;
    let inputs = inputs_of(&table, base_dir, &label, &entries)?;
    let correlations =
        rank_correlation::read(&table, &entries).map_err(|issues| invalid(&label, issues))?;
    crate::wind::site_wind(&case, "risk")?;

    let full = |values: &[f64]| -> Result<crate::case::Case, String> {
        let mut t = table.clone();
        for (inp, &x) in inputs.iter().zip(values) {
            if inp.role != Role::CLatFactor {
                keypath::insert_number(&mut t, &inp.key, x).map_err(|e| e.to_string())?;
            }
        }
        input::parse_case_table(t, base_dir, &label).map_err(|e| {
            let issues: Vec<String> = e.issues().iter().map(|i| i.to_string()).collect();
            if issues.is_empty() {
                e.to_string()
            } else {
                issues.join("; ")
            }
        })
    };
    let mut staging = Staging::begin(out_dir)?;
    let engine = Engine::new(&case, &inputs, o.seed, &full)
        .map_err(|e| match e {
            risk::RiskError::Modal(m) => Error::Modal(m),
            risk::RiskError::Wind(w) => Error::Wind(w),
        })?
        .with_copula(correlations.copula.clone());
    let engine = if o.with_resistance {
        engine
            .with_resistance()
            .map_err(|e| usage("--with-resistance", "on", e.to_string()))?
    } else {
        engine
    };
    let mut header = header(&case, &engine, o)?;
    header.correlations = correlations.info.clone();
    let (k, n) = o.shard.unwrap_or((1, 1));
    let (from, to) = risk::shard_range(o.samples, k, n);

    let bar = progress_bar(to - from);
    let writer = out::sample_row_writer(&header);
    let rows: Option<&RowWriter> = o.keep_samples.then_some(&*writer as &RowWriter);
    let start = std::time::Instant::now();
    let (acc, text) = run_range(&engine, from, to, rows, &|m| bar.inc(m));
    bar.finish_and_clear();
    let seconds = start.elapsed().as_secs_f64();

    let mut stdout = format!(
        "{} samples ({}) in {seconds:.2} s on {} threads; {}\n",
        to - from,
        if o.shard.is_some() {
            format!("shard {k}/{n}: samples {from} to {}", to.saturating_sub(1))
        } else {
            format!("seed {}", o.seed)
        },
        rayon::current_num_threads(),
        if engine.shortcut {
            "every sample reused the case's modes"
        } else {
            "every sample re-solved (some key changes mass, geometry or springs)"
        }
    );
    if o.shard.is_some() {
        let partial = Partial {
            header: header.clone(),
            shard: k,
            shards: n,
            from,
            to,
            accumulator: acc.canonical(),
        };
        staging.write(PARTIAL_FILE, &out::partial_json(&partial)?)?;
        if o.keep_samples {
            staging.write(SAMPLES_FILE, &text)?;
        }
        stdout.push_str(&format!(
            "partial result of shard {k}/{n}: combine the shards with `stackwake risk-merge DIR...`\n"
        ));
    } else {
        let samples = o.keep_samples.then(|| {
            let mut all = out::samples_header(&header);
            all.extend_from_slice(&text);
            all
        });
        write_final(&mut staging, &header, &acc, samples.as_deref())?;
        stdout.push_str(&out::stdout_summary(&header, &acc));
    }
    let files = staging.commit()?;
    let mut warn = correlations.warnings.clone();
    warn.extend(warnings(&header, &acc));
    Ok(CommandReport {
        stdout,
        warnings: warn,
        check_failed: false,
        not_judged: false,
        files,
    })
}

fn warnings(header: &RiskHeader, acc: &Accumulator) -> Vec<String> {
    let mut w = Vec::new();
    if header.inputs.is_empty() {
        w.push("the case has no [[uncertain]] entries: every sample is the case itself".into());
    }
    if header.method != "en1991-e1" && header.inputs.iter().any(|i| i.key == C_LAT_FACTOR_KEY) {
        w.push(format!(
            "{C_LAT_FACTOR_KEY} scales c_lat of EN 1991-1-4 approach 1 only; the governing \
             method {} does not use c_lat, so this input has no effect",
            header.method
        ));
    }
    if acc.invalid > 0 {
        let (i, m) = acc.first_invalid.clone().unwrap_or_default();
        w.push(format!(
            "{} samples break a case-file rule or failed and are left out of the statistics \
             (first: sample {i}: {m})",
            acc.invalid
        ));
    }
    if !header.judged {
        w.push(
            "no [criteria] given: only the E.1.2 range probabilities and the distributions are \
             reported; exceedance probabilities need criteria"
                .into(),
        );
    }
    w
}

fn header(case: &crate::case::Case, engine: &Engine, o: &RiskOptions) -> Result<RiskHeader, Error> {
    let stages = risk::case_modes(case)?;
    let results = crate::wind::check_all(case, &stages)?;
    let modes: Vec<ModeInfo> = results
        .stages
        .iter()
        .flat_map(|s| {
            s.modes.iter().map(|m| ModeInfo {
                stage: s.stage.clone(),
                mode: m.mode,
                case_frequency_hz: m.frequency_hz,
                case_verdict: m.verdict.to_string(),
            })
        })
        .collect();
    let source = case.source.clone();
    Ok(RiskHeader {
        format: PARTIAL_FORMAT.into(),
        case_file: source
            .as_ref()
            .map_or_else(String::new, |s| s.file_name.clone()),
        case_sha256: source.map_or_else(String::new, |s| s.sha256_hex),
        title: case.title.clone(),
        samples: o.samples,
        seed: o.seed,
        method: case.vortex.method.key().into(),
        judged: !case.criteria.is_empty(),
        tip_criterion: case.criteria.tip_amplitude_m.is_some()
            || case.criteria.tip_amplitude_per_diameter.is_some(),
        stress_criterion: case.criteria.stress_pa.is_some(),
        keep_samples: o.keep_samples,
        inputs: engine
            .inputs
            .iter()
            .map(|i| InputInfo {
                key: i.key.clone(),
                described: i.described.clone(),
                case_value: i.case_value.is_finite().then_some(i.case_value),
                keeps_modes: engine.shortcut && i.role.keeps_modes(),
                interpolated: engine.family.is_some() && i.role.uses_family(),
            })
            .collect(),
        stiffness_family: engine.family.as_ref().map(|f| f.info.clone()),
        stiffness_family_error: engine.family_error.clone(),
        stages: case.stages.iter().map(|s| s.name.clone()).collect(),
        stage_of: engine.kernels.iter().map(|k| k.stage_index).collect(),
        modes,
        correlations: Vec::new(),
        resistance: engine.resistance.is_some(),
    })
}

fn write_final(
    staging: &mut Staging,
    header: &RiskHeader,
    acc: &Accumulator,
    samples: Option<&[u8]>,
) -> Result<(), Error> {
    staging.write("risk.csv", &out::risk_csv(header, acc)?)?;
    staging.write("summary.json", &out::summary_json(header, acc)?)?;
    let hist = out::histograms_svg(header, acc);
    let tornado = out::influence_svg(header, acc);
    staging.write("risk_histograms.svg", hist.as_bytes())?;
    staging.write("risk_influence.svg", tornado.as_bytes())?;
    staging.write(
        "risk.html",
        out::risk_html(header, acc, &hist, &tornado).as_bytes(),
    )?;
    if let Some(s) = samples {
        staging.write(SAMPLES_FILE, s)?;
    }
    Ok(())
}

/// Runs `risk-merge`.
pub fn merge(dirs: &[PathBuf], out_dir: &Path) -> Result<CommandReport, Error> {
    if dirs.is_empty() {
        return Err(usage("DIR", "", "give the shard folders to merge"));
    }
    let mut parts: Vec<(PathBuf, Partial)> = Vec::new();
    for d in dirs {
        let p = input::risk_partial::read(&d.join(PARTIAL_FILE))?;
        parts.push((d.clone(), p));
    }
    let first = parts[0].1.header.clone();
    let shards = parts[0].1.shards;
    for (d, p) in &parts {
        if p.header.case_sha256 != first.case_sha256 {
            return Err(usage(
                "DIR",
                d.display(),
                format!(
                    "partial result of another case (SHA-256 {} of {}, not {} of {}): \
                     merge only shards of one run",
                    p.header.case_sha256, p.header.case_file, first.case_sha256, first.case_file
                ),
            ));
        }
        if p.header != first || p.shards != shards {
            return Err(usage(
                "DIR",
                d.display(),
                "partial result of the same case with other settings (samples, seed, \
                 --keep-samples, inputs or shard count): merge only shards of one run",
            ));
        }
    }
    parts.sort_by_key(|(_, p)| p.shard);
    for (i, (d, p)) in parts.iter().enumerate() {
        if p.shard != i as u64 + 1 {
            return Err(usage(
                "DIR",
                d.display(),
                format!(
                    "shard {}/{shards} given twice, or shard {}/{shards} missing: give each of \
                     the {shards} shards once",
                    p.shard,
                    i + 1
                ),
            ));
        }
        let want = risk::shard_range(first.samples, p.shard, shards);
        if (p.from, p.to) != want {
            return Err(usage(
                "DIR",
                d.display(),
                "the shard's sample range is not its slice",
            ));
        }
    }
    if parts.len() as u64 != shards {
        return Err(usage(
            "DIR",
            dirs.len(),
            format!(
                "{} of {shards} shards given: give every shard once",
                parts.len()
            ),
        ));
    }
    let mut acc = parts[0].1.accumulator.clone();
    for (_, p) in &parts[1..] {
        acc.merge(&p.accumulator);
    }
    let samples = if first.keep_samples {
        let mut all = out::samples_header(&first);
        for (d, _) in &parts {
            all.extend_from_slice(&input::risk_partial::read_samples(&d.join(SAMPLES_FILE))?);
        }
        Some(all)
    } else {
        None
    };
    let mut staging = Staging::begin(out_dir)?;
    write_final(&mut staging, &first, &acc, samples.as_deref())?;
    let files = staging.commit()?;
    let mut stdout = format!("merged {shards} shards of {} samples\n", first.samples);
    stdout.push_str(&out::stdout_summary(&first, &acc));
    Ok(CommandReport {
        stdout,
        warnings: warnings(&first, &acc),
        check_failed: false,
        not_judged: false,
        files,
    })
}
