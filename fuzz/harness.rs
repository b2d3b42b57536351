//! The byte-to-input mappings of the fuzz targets and the invariants they check, shared by
//! `fuzz/fuzz_targets/*.rs` (libFuzzer, nightly) and `tests/fuzz_regressions.rs` (plain
//! `cargo test`, replaying the minimised corpora), so both run exactly the same code.
//!
//! A panic here is a finding: either the library panicked, or it returned something that
//! breaks a documented invariant of `Case` or of the modal results.

#![allow(dead_code)]

use stackwake::case::Case;
use stackwake::input::{parse_case_with_csv, parse_stations_csv};
use stackwake::modal::{analyse_case, ModalOptions};

/// Case file text and stations CSV text from fuzz bytes: the part before the first NUL byte
/// is the case file, the part after it (if any) the CSV that `stations_csv` names.
pub fn split_case_and_csv(data: &[u8]) -> (String, Option<String>) {
    match data.iter().position(|&b| b == 0) {
        Some(i) => (
            String::from_utf8_lossy(&data[..i]).into_owned(),
            Some(String::from_utf8_lossy(&data[i + 1..]).into_owned()),
        ),
        None => (String::from_utf8_lossy(data).into_owned(), None),
    }
}

/// Bytes -> case file (+ CSV) -> validated case; checks that an accepted case keeps the
/// invariants documented on `Case` and that a refusal has a message.
pub fn case_loader(data: &[u8]) {
    let (text, csv) = split_case_and_csv(data);
    if let Some(csv) = &csv {
        if let Err(issues) = parse_stations_csv(csv, "fuzz.csv") {
            assert!(!issues.is_empty(), "CSV refused without an issue");
        }
    }
    match parse_case_with_csv(&text, "fuzz.toml", csv.as_deref()) {
        Ok(case) => assert_case_invariants(&case),
        Err(e) => assert!(!e.to_string().is_empty(), "empty error message"),
    }
}

/// The invariants `input::validate` promises the engineering core (see src/case.rs).
pub fn assert_case_invariants(case: &Case) {
    let s = &case.shell;
    assert!(s.elastic_modulus_pa.is_finite() && s.elastic_modulus_pa > 0.0);
    assert!(s.density_kg_m3.is_finite() && s.density_kg_m3 > 0.0);
    assert!((0.0..0.5).contains(&s.poisson_ratio));
    assert!(s.stations.len() >= 2, "fewer than 2 stations accepted");
    assert_eq!(s.stations[0].z_m, 0.0, "first station not at 0 accepted");
    for w in s.stations.windows(2) {
        assert!(w[1].z_m > w[0].z_m, "stations not increasing accepted");
    }
    let h = s.height_m();
    assert!(h.is_finite() && h > 0.0);
    for st in &s.stations {
        assert!(st.outer_diameter_m.is_finite() && st.outer_diameter_m > 0.0);
        assert!(st.wall_m.is_finite() && st.wall_m > 0.0);
        assert!(
            2.0 * st.wall_m < st.outer_diameter_m,
            "wall >= radius accepted"
        );
    }
    for l in &case.linings {
        assert!(0.0 <= l.from_z_m && l.from_z_m < l.to_z_m && l.to_z_m <= h);
    }
    for p in &case.point_masses {
        assert!(
            (0.0..=h).contains(&p.z_m),
            "point mass outside the shell accepted"
        );
        assert!(p.mass_kg.is_finite() && p.mass_kg > 0.0);
    }
    assert!(!case.stages.is_empty());
    for st in &case.stages {
        let top = st.height_m(s);
        assert!(
            top.is_finite() && top > 0.0 && top <= h,
            "stage top outside the shell accepted"
        );
    }
}

/// Reads bounded numbers from fuzz bytes (zeros once the bytes run out).
pub struct Numbers<'a> {
    data: &'a [u8],
}

impl<'a> Numbers<'a> {
    pub fn new(data: &'a [u8]) -> Self {
        Numbers { data }
    }

    pub fn byte(&mut self) -> u8 {
        match self.data.split_first() {
            Some((&b, rest)) => {
                self.data = rest;
                b
            }
            None => 0,
        }
    }

    /// A fraction in [0, 1].
    pub fn unit(&mut self) -> f64 {
        let v = u16::from_le_bytes([self.byte(), self.byte()]);
        f64::from(v) / f64::from(u16::MAX)
    }

    /// Log-uniform in [lo, hi] (both > 0).
    pub fn log_range(&mut self, lo: f64, hi: f64) -> f64 {
        lo * (hi / lo).powf(self.unit())
    }

    /// Uniform in [lo, hi].
    pub fn range(&mut self, lo: f64, hi: f64) -> f64 {
        lo + (hi - lo) * self.unit()
    }

    /// A whole number in [lo, hi].
    pub fn count(&mut self, lo: usize, hi: usize) -> usize {
        lo + usize::from(self.byte()) % (hi - lo + 1)
    }
}

/// A case file built from fuzz bytes: extreme but mostly valid geometry (heights 1-1500 m,
/// diameters 0.1-200 m, walls from 0.1 % to 98 % of the radius, masses up to 1e9 kg, base
/// springs over twelve decades), plus the analysis options.
pub fn case_text_from(data: &[u8]) -> (String, ModalOptions) {
    let mut n = Numbers::new(data);
    let mut t = String::from("title = \"fuzz\"\n[shell]\n");
    t += &format!("elastic_modulus_gpa = {:?}\n", n.log_range(1.0, 1000.0));
    t += &format!("density_kg_m3 = {:?}\n", n.log_range(500.0, 10000.0));
    t += &format!("poisson_ratio = {:?}\n", n.range(0.0, 0.49));
    if n.byte() % 2 == 1 {
        t += "beam = \"euler-bernoulli\"\n";
    }
    let stations = n.count(2, 12);
    // About the accepted ranges of src/input/physical.rs (height 1000 m, D/t 1000,
    // stage top 1 % of the height): mostly valid, sometimes refused.
    let height = n.log_range(1.0, 1100.0);
    let steps: Vec<f64> = (1..stations).map(|_| n.range(0.01, 1.0)).collect();
    let total: f64 = steps.iter().sum();
    t += "stations = [\n";
    let mut z = 0.0;
    for i in 0..stations {
        if i > 0 {
            z = if i + 1 == stations {
                height
            } else {
                z + height * steps[i - 1] / total
            };
        }
        let d = n.log_range(0.1, 200.0);
        let wall = 0.5 * d * n.log_range(0.0022, 0.98);
        t += &format!("  {{ z_m = {z:?}, outer_diameter_m = {d:?}, wall_m = {wall:?} }},\n");
    }
    t += "]\n";
    for _ in 0..n.count(0, 2) {
        let a = n.range(0.0, height);
        let b = n.range(0.0, height);
        t += &format!(
            "[[lining]]\nfrom_z_m = {:?}\nto_z_m = {:?}\nmass_per_length_kg_m = {:?}\n",
            a.min(b),
            a.max(b),
            n.log_range(1.0, 1e6)
        );
    }
    // Point masses are written after the stages: each lists the stages whose top it is not
    // above (a mass above a stage it is present in is an input error), which takes no bytes.
    let masses: Vec<(f64, f64)> = (0..n.count(0, 3))
        .map(|_| (n.range(0.0, height), n.log_range(1.0, 1e9)))
        .collect();
    if n.byte() % 2 == 1 {
        t += &format!(
            "[base]\nrotational_stiffness_gnm_per_rad = {:?}\nlateral_stiffness_mn_per_m = {:?}\n",
            n.log_range(1e-3, 1e9),
            n.log_range(1e-3, 1e9)
        );
    }
    let mut tops = Vec::new();
    for i in 0..n.count(1, 3) {
        t += &format!(
            "[[stage]]\nname = \"s{i}\"\nlining = {}\nstiffness_factor = {:?}\n",
            n.byte() % 2 == 1,
            n.log_range(0.05, 2.0)
        );
        let mut top = height;
        if n.byte() % 2 == 1 {
            top = height * n.range(0.008, 1.0);
            t += &format!("top_z_m = {top:?}\n");
        }
        tops.push(top);
    }
    for (z, kg) in masses {
        let names: Vec<String> = tops
            .iter()
            .enumerate()
            .filter(|(_, &top)| z <= top)
            .map(|(i, _)| format!("\"s{i}\""))
            .collect();
        if names.is_empty() {
            continue;
        }
        t += &format!(
            "[[point_mass]]\nz_m = {z:?}\nmass_kg = {kg:?}\nstages = [{}]\n",
            names.join(", ")
        );
    }
    t += "[wind]\nreference_speed_m_s = 25.0\n";
    let modes = n.count(1, 6);
    let min_elements = match n.byte() % 3 {
        0 => None,
        _ => Some(n.count(1, 255) * 2),
    };
    (
        t,
        ModalOptions {
            modes,
            min_elements,
        },
    )
}

/// Bytes -> case -> modal analysis of every stage. An accepted case must give, for every
/// stage, finite increasing positive frequencies with a passing completeness check, or a
/// solver error naming the stage.
pub fn analysis(data: &[u8]) {
    let (text, options) = case_text_from(data);
    let Ok(case) = parse_case_with_csv(&text, "fuzz.toml", None) else {
        return;
    };
    match analyse_case(&case, options) {
        Ok(stages) => {
            assert_eq!(stages.len(), case.stages.len());
            for s in &stages {
                assert_eq!(s.modes.len(), options.modes, "stage {}", s.stage.name);
                assert_eq!(s.check.modes_reported, options.modes);
                assert!(
                    s.check.sturm_count >= options.modes,
                    "completeness not proven"
                );
                let mut last = 0.0;
                for m in &s.modes {
                    assert!(
                        m.frequency_hz.is_finite() && m.frequency_hz > last,
                        "stage {}: bad frequency {} after {last}\n{text}",
                        s.stage.name,
                        m.frequency_hz
                    );
                    last = m.frequency_hz;
                    assert!(m.modal_mass_kg.is_finite() && m.modal_mass_kg > 0.0);
                    assert!(m.equivalent_mass_kg_m.is_finite());
                    assert!(m.displacement.iter().all(|w| w.is_finite()));
                }
            }
            // The vortex checks of any analysable stack finish with finite numbers.
            // The generated case files always have [wind].
            let vortex = stackwake::wind::check_all(&case, &stages)
                .expect("the analysis harness writes a [wind] section");
            for row in vortex.vortex_rows() {
                assert!(row.critical_speed_m_s.is_finite() && row.critical_speed_m_s > 0.0);
                assert!(row.scruton.is_finite() && row.reynolds.is_finite());
                for v in [row.tip_amplitude_m, row.base_moment_nm, row.fatigue_cycles]
                    .into_iter()
                    .flatten()
                {
                    assert!(
                        v.is_finite(),
                        "stage {} mode {}: non-finite result\n{text}",
                        row.stage,
                        row.mode
                    );
                }
            }
        }
        Err(e) => {
            let msg = e.to_string();
            assert!(
                case.stages
                    .iter()
                    .any(|s| msg.starts_with(&format!("stage `{}`", s.name))),
                "solver error without the stage: {msg}"
            );
        }
    }
}

/// The `[wind]` and `[vortex]` sections of the `check` target, drawn over (and a little past)
/// the ranges the validator accepts (src/input/limits.rs: air density 0.5-2 kg/m3, log
/// decrement 1e-3 to < 1, design life up to 1000 years), both profiles and both Annex E
/// approaches; values past a bound must be refused with an error, never reach a plot.
pub fn wind_text_from(n: &mut Numbers) -> String {
    let mut t = String::from("[wind]\n");
    t += &format!("reference_speed_m_s = {:?}\n", n.log_range(0.1, 150.0));
    t += &format!("reference_height_m = {:?}\n", n.log_range(0.5, 300.0));
    if n.byte().is_multiple_of(2) {
        t += &format!("profile = \"power\"\nexponent = {:?}\n", n.range(0.02, 0.7));
    } else {
        t += &format!(
            "profile = \"log\"\nroughness_m = {:?}\n",
            n.log_range(1e-4, 3.0)
        );
    }
    t += &format!("air_density_kg_m3 = {:?}\n", n.log_range(0.45, 2.2));
    t += &format!("kinematic_viscosity_m2_s = {:?}\n", n.log_range(1e-6, 1e-4));
    t += "[vortex]\n";
    t += if n.byte().is_multiple_of(2) {
        "method = \"en1991-e1\"\n"
    } else {
        "method = \"en1991-e2\"\n"
    };
    if n.byte() % 2 == 1 {
        t += &format!("strouhal = {:?}\n", n.range(0.05, 0.5));
    }
    t += &format!("log_decrement = {:?}\n", n.log_range(5e-4, 1.2));
    t += &format!("modes = {}\n", n.count(1, 4));
    t += &format!("design_life_years = {:?}\n", n.log_range(0.01, 1200.0));
    t
}

/// Bytes 0..32 give the wind and vortex values, the rest the geometry of
/// [`case_text_from`] (whose fixed `[wind]` line is replaced).
pub fn check_case_text_from(data: &[u8]) -> String {
    const WIND_BYTES: usize = 32;
    let (wind, geometry) = data.split_at(data.len().min(WIND_BYTES));
    let (text, _) = case_text_from(geometry);
    let text = text.replace("[wind]\nreference_speed_m_s = 25.0\n", "");
    text + &wind_text_from(&mut Numbers::new(wind))
}

/// A fresh, empty folder for one `check` run of the fuzz target.
fn scratch_folder() -> std::path::PathBuf {
    use std::sync::atomic::{AtomicUsize, Ordering};
    static RUN: AtomicUsize = AtomicUsize::new(0);
    let dir = std::env::temp_dir().join(format!(
        "stackwake-fuzz-check-{}-{}",
        std::process::id(),
        RUN.fetch_add(1, Ordering::Relaxed)
    ));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("create the scratch folder");
    dir
}

/// Every file `check` wrote can be read back: CSVs parse and every cell that parses as a
/// number is finite, SVGs are well-formed XML, `summary.json` is JSON, the note is not empty.
pub fn assert_outputs_readable(out: &std::path::Path, text: &str) {
    let mut seen = 0;
    for entry in std::fs::read_dir(out).expect("list the output folder") {
        let path = entry.expect("directory entry").path();
        let name = path.file_name().unwrap().to_string_lossy().into_owned();
        if name.starts_with('.') {
            continue;
        }
        seen += 1;
        let bytes = std::fs::read(&path).expect("read an output file");
        let body = String::from_utf8(bytes).unwrap_or_else(|_| panic!("{name} is not UTF-8"));
        if name.ends_with(".csv") {
            let mut reader = csv::ReaderBuilder::new()
                .has_headers(true)
                .from_reader(body.as_bytes());
            for record in reader.records() {
                let record = record.unwrap_or_else(|e| panic!("{name}: {e}\n{text}"));
                for cell in record.iter() {
                    if let Ok(v) = cell.trim().parse::<f64>() {
                        assert!(v.is_finite(), "{name}: non-finite cell {cell:?}\n{text}");
                    }
                }
            }
        } else if name.ends_with(".svg") {
            roxmltree::Document::parse(&body)
                .unwrap_or_else(|e| panic!("{name} is not well-formed: {e}\n{text}"));
        } else if name.ends_with(".json") {
            serde_json::from_str::<serde_json::Value>(&body)
                .unwrap_or_else(|e| panic!("{name} is not JSON: {e}\n{text}"));
        } else {
            assert!(!body.is_empty(), "{name} is empty");
        }
    }
    assert!(seen > 0, "check succeeded but wrote nothing\n{text}");
}

/// Bytes -> case file (wind and vortex over their accepted ranges, geometry as in
/// [`analysis`]) -> `check` end to end, plots and writers included, into a scratch folder.
/// Either every written file reads back with finite numbers, or an error with a message and
/// nothing but the case file left behind. Returns whether `check` wrote its outputs.
pub fn check(data: &[u8]) -> bool {
    let text = check_case_text_from(data);
    let dir = scratch_folder();
    let case_path = dir.join("case.toml");
    std::fs::write(&case_path, &text).expect("write the case file");
    let out = dir.join("out");
    let options = stackwake::commands::check::CheckOptions { min_elements: None };
    let wrote = match stackwake::commands::check::run(Some(&case_path), &out, options) {
        Ok(_) => {
            assert_outputs_readable(&out, &text);
            true
        }
        Err(e) => {
            assert!(!e.to_string().is_empty(), "empty error message");
            let left: Vec<_> = std::fs::read_dir(&out)
                .map(|r| r.filter_map(|e| e.ok()).map(|e| e.file_name()).collect())
                .unwrap_or_default();
            assert!(
                left.iter()
                    .all(|n| n.to_string_lossy().starts_with(".stackwake")),
                "a failed check left outputs {left:?}: {e}\n{text}"
            );
            false
        }
    };
    let _ = std::fs::remove_dir_all(&dir);
    wrote
}
