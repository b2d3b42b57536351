//! `sweep`: a full grid of case-file values, every variant analysed exactly like `check`, in
//! parallel on all cores (rayon), with a progress bar on a terminal (indicatif) and silence
//! otherwise. Writes sweep.csv and, when two or more keys vary, sweep_map.svg over the first
//! two. A variant that breaks a case-file rule becomes a row `invalid: <message>`; a key that
//! does not exist or is not a number stops the sweep before any work (exit 2).

use std::path::Path;

use indicatif::{ProgressBar, ProgressStyle};
use rayon::prelude::*;

use crate::error::Error;
use crate::input::{self, keypath};
use crate::report::staging::Staging;
use crate::report::sweep::{lock_in_map_svg, sweep_csv};
use crate::sweep::{self, Class, Variant, VariantOutcome, Vary};

use super::CommandReport;

/// Checks that every key holds a number in the case file, or is a key the case file
/// accepts but leaves to its default (an optional key such as `vortex.strouhal`: the sweep
/// writes it into each variant).
pub fn check_keys(table: &toml::Table, vary: &[Vary]) -> Result<(), Error> {
    for v in vary {
        let usage = |rule: String| Error::Usage {
            option: "--vary".into(),
            value: v.key.clone(),
            rule,
        };
        match keypath::get_number(table, &v.key) {
            Ok(_) => {}
            Err(keypath::KeyPathError::Missing { .. }) => {
                check_absent_key(table, v).map_err(usage)?;
            }
            Err(e) => return Err(usage(e.to_string())),
        }
    }
    let mut keys: Vec<&str> = vary.iter().map(|v| v.key.as_str()).collect();
    keys.sort_unstable();
    if keys.windows(2).any(|w| w[0] == w[1]) {
        return Err(Error::Usage {
            option: "--vary".into(),
            value: vary
                .iter()
                .map(|v| v.key.as_str())
                .collect::<Vec<_>>()
                .join(" "),
            rule: "each key may be varied only once".into(),
        });
    }
    Ok(())
}

/// An absent key may be swept when the case-file reader accepts a number there: it is
/// written into a copy of the file and the reader's verdict on that key (unknown key,
/// wrong type) is the answer. Problems elsewhere in the file are left to the variants.
fn check_absent_key(table: &toml::Table, v: &Vary) -> Result<(), String> {
    let mut t = table.clone();
    if let Err(e) = keypath::insert_number(&mut t, &v.key, v.from) {
        return Err(e.to_string());
    }
    let Err(issues) = input::decode::decode_case(t) else {
        return Ok(());
    };
    let on_key = issues.iter().find(|i| {
        v.key == i.path
            || v.key
                .strip_prefix(i.path.as_str())
                .is_some_and(|rest| rest.starts_with(['.', '[']))
    });
    match on_key {
        None => Ok(()),
        Some(i) => Err(format!(
            "not in the case file, and not a number key the case file accepts ({i});              an optional key left out of the file can be swept by its full path, e.g.              vortex.strouhal=0.16:0.20:5"
        )),
    }
}

/// Analyses one variant: edits the parsed case table, validates, analyses.
pub fn run_variant(
    table: &toml::Table,
    base_dir: &Path,
    label: &str,
    vary: &[Vary],
    index: usize,
) -> Variant {
    let values = sweep::grid_point(vary, index);
    let mut t = table.clone();
    for (v, &x) in vary.iter().zip(&values) {
        // `check_keys` accepted the key: its own number, or an optional key left out.
        if let Err(e) = keypath::insert_number(&mut t, &v.key, x) {
            // Keys are checked before the sweep; this is only reachable if the table changed.
            return Variant {
                index,
                values,
                outcome: VariantOutcome::Invalid(e.to_string()),
            };
        }
    }
    let outcome = match input::parse_case_table(t, base_dir, label) {
        Err(e) => {
            let issues = e.issues();
            let msg = if issues.is_empty() {
                e.to_string()
            } else {
                issues
                    .iter()
                    .map(|i| i.to_string())
                    .collect::<Vec<_>>()
                    .join("; ")
            };
            VariantOutcome::Invalid(msg)
        }
        Ok(case) => match sweep::analyse_variant(&case) {
            Ok(rows) => match first_non_finite(&rows) {
                None => VariantOutcome::Rows(rows),
                Some(msg) => VariantOutcome::Failed(msg),
            },
            Err(e) => VariantOutcome::Failed(e.to_string()),
        },
    };
    Variant {
        index,
        values,
        outcome,
    }
}

/// Runs the whole grid in parallel; `progress` is called once per finished variant.
pub fn run_grid(
    table: &toml::Table,
    base_dir: &Path,
    label: &str,
    vary: &[Vary],
    progress: &(dyn Fn() + Sync),
) -> Result<Vec<Variant>, Error> {
    let n = sweep::grid_size(vary).ok_or_else(|| Error::Usage {
        option: "--vary".into(),
        value: vary
            .iter()
            .map(|v| v.steps.to_string())
            .collect::<Vec<_>>()
            .join(" x "),
        rule: format!("the grid may have at most {} variants", sweep::MAX_VARIANTS),
    })?;
    check_keys(table, vary)?;
    Ok((0..n)
        .into_par_iter()
        .map(|i| {
            let v = run_variant(table, base_dir, label, vary, i);
            progress();
            v
        })
        .collect())
}

/// Runs `sweep` and writes its outputs.
pub fn run(case_path: &Path, vary_args: &[String], out: &Path) -> Result<CommandReport, Error> {
    let vary: Vec<Vary> = vary_args
        .iter()
        .map(|a| Vary::parse(a))
        .collect::<Result<_, _>>()
        .map_err(|e| Error::Usage {
            option: "--vary".into(),
            value: match &e {
                sweep::VaryError::Bad { arg, .. } => arg.clone(),
            },
            rule: match e {
                sweep::VaryError::Bad { rule, .. } => rule,
            },
        })?;
    if vary.is_empty() {
        return Err(Error::Usage {
            option: "--vary".into(),
            value: String::new(),
            rule: "give at least one --vary KEY=FROM:TO:STEPS".into(),
        });
    }
    let table = input::read_case_table(case_path)?;
    let label = case_path.display().to_string();
    let base_dir = case_path.parent().unwrap_or_else(|| Path::new(""));
    // Fail on a bad key before creating the output folder or doing any work.
    check_keys(&table, &vary)?;
    // Every variant is checked like `check`, wind checks included; a case without [wind]
    // is a modal sweep (frequencies only, nothing judged, no lock-in map).
    let modal_only =
        !table.contains_key("wind") && !vary.iter().any(|v| v.key.starts_with("wind."));
    let mut staging = Staging::begin(out)?;

    let n = sweep::grid_size(&vary).unwrap_or(0) as u64;
    let bar = if std::io::IsTerminal::is_terminal(&std::io::stderr()) {
        let b = ProgressBar::new(n);
        if let Ok(style) = ProgressStyle::with_template(
            "{bar:40} {pos}/{len} variants, {elapsed} elapsed, ~{eta} left",
        ) {
            b.set_style(style);
        }
        b
    } else {
        ProgressBar::hidden()
    };
    let start = std::time::Instant::now();
    let variants = run_grid(&table, base_dir, &label, &vary, &|| bar.inc(1))?;
    bar.finish_and_clear();
    let seconds = start.elapsed().as_secs_f64();

    staging.write("sweep.csv", &sweep_csv(&vary, &variants)?)?;
    let mut map_note = None;
    if vary.len() >= 2 && !modal_only {
        let map = sweep::lock_in_map(&vary, 0, 1, &variants);
        let title = format!("stackwake sweep of {label}");
        staging.write("sweep_map.svg", lock_in_map_svg(&map, &title).as_bytes())?;
        map_note = map.hidden_keys_note();
    }
    let files = staging.commit()?;

    let mut counts = [0usize; 5];
    for v in &variants {
        counts[sweep::summarise(&v.outcome).0 as usize] += 1;
    }
    let mut stdout = format!(
        "{} variants ({}) in {seconds:.2} s on {} threads\n",
        variants.len(),
        vary.iter()
            .map(|v| format!("{} x {}", v.key, v.steps))
            .collect::<Vec<_>>()
            .join(", "),
        rayon::current_num_threads()
    );
    for class in Class::ALL {
        stdout.push_str(&format!(
            "  worst verdict {:<8} {:>8} variants\n",
            class.label(),
            counts[class as usize]
        ));
    }
    if modal_only {
        stdout.push_str(
            "modal sweep: the case has no [wind], so sweep.csv holds frequencies only (no \
             vortex check, no verdict, no lock-in map); add [wind] to check lock-in\n",
        );
    }
    if let Some(note) = map_note {
        stdout.push_str(&format!(
            "sweep_map.svg shows {} x {}. {note}\n",
            vary[0].key, vary[1].key
        ));
    }
    stdout.push_str(
        "Screening tool: results must be checked by a licensed engineer against the local code and National Annex.\n",
    );
    let warnings = if counts[Class::Invalid as usize] > 0 {
        vec![format!(
            "{} variants break a case-file rule or failed; see the verdict column of sweep.csv",
            counts[Class::Invalid as usize]
        )]
    } else {
        Vec::new()
    };
    Ok(CommandReport {
        stdout,
        warnings,
        // A sweep explores; failing variants are its findings, not a failed check.
        check_failed: false,
        not_judged: false,
        files,
    })
}

/// The first non-finite number of a variant's rows, as a message: such a variant is a
/// failed one (its verdict cell says why), so no `inf` or `NaN` reaches sweep.csv.
fn first_non_finite(rows: &[sweep::ModeRow]) -> Option<String> {
    rows.iter().find_map(|r| {
        [
            ("frequency_hz", Some(r.frequency_hz)),
            ("critical_speed_m_s", r.critical_speed_m_s),
            ("speed_ratio", r.speed_ratio),
            ("scruton", r.scruton),
            ("tip_amplitude_m", r.tip_amplitude_m),
            ("max_stress_pa", r.max_stress_pa),
            ("required_log_decrement", r.required_log_decrement),
        ]
        .into_iter()
        .find_map(|(name, v)| v.filter(|x| !x.is_finite()).map(|x| (name, x)))
        .map(|(name, x)| {
            format!(
                "stage `{}` mode {}: {name} = {x} is not finite; this variant's grid values \
                 drive it outside what the analysis can compute",
                r.stage, r.mode
            )
        })
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sweep::{DampingRemedy, ModeRow};

    fn row(tip_amplitude_m: Option<f64>) -> ModeRow {
        ModeRow {
            stage: "lined".into(),
            mode: 2,
            frequency_hz: 0.5,
            critical_speed_m_s: Some(20.0),
            speed_ratio: Some(0.8),
            scruton: Some(9.0),
            tip_amplitude_m,
            max_stress_pa: Some(1e6),
            required_log_decrement: None,
            damping_remedy: DampingRemedy::NotNeeded,
            combined_to_along_base_ratio: None,
            verdict: crate::wind::Verdict::NotJudged,
        }
    }

    #[test]
    fn a_non_finite_row_fails_its_variant_naming_stage_mode_and_quantity() {
        assert_eq!(first_non_finite(&[row(Some(0.1)), row(None)]), None);
        let msg = first_non_finite(&[row(Some(0.1)), row(Some(f64::INFINITY))]).unwrap();
        assert!(
            msg.starts_with("stage `lined` mode 2: tip_amplitude_m = inf is not finite"),
            "{msg}"
        );
        assert!(first_non_finite(&[row(Some(f64::NAN))]).is_some());
    }
}
