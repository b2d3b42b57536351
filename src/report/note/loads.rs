//! Section 7 of the note: load effects of the governing method at the lock-in amplitude.

use super::markup::{heads, n, opt, sci, t, Table};
use crate::report::ReportInput;

pub(super) fn write(out: &mut String, input: &ReportInput) {
    let mut rows = Vec::new();
    for s in &input.vortex.stages {
        for m in &s.modes {
            let g = m.governing_summary();
            let peak = m
                .loads
                .iter()
                .max_by(|a, b| a.stress_pa.abs().total_cmp(&b.stress_pa.abs()));
            rows.push(vec![
                t(&s.stage),
                n(m.mode.to_string()),
                n(opt(g.tip_amplitude_m, 4)),
                n(opt(m.loads.first().map(|l| l.shear_n / 1e6), 3)),
                n(opt(g.base_moment_nm.map(|v| v / 1e6), 1)),
                n(opt(g.max_stress_pa.map(|v| v / 1e6), 2)),
                n(opt(peak.map(|l| l.z_m), 1)),
                n(g.fatigue_cycles.map_or("-".into(), sci)),
            ]);
        }
    }
    Table {
        head: heads(&[
            "stage",
            "mode i",
            "y<sub>tip</sub> (m)",
            "V<sub>base</sub> (MN)",
            "M<sub>base</sub> (MN&#183;m)",
            "&#963;<sub>max</sub> (MPa)",
            "at z (m)",
            "load cycles N (-)",
        ]),
        rows,
    }
    .write(out);
    out.push_str(
        "<p class=\"small\">Loads of the governing method at the lock-in amplitude; the full \
         distributions along the height are in loads.csv.</p>\n",
    );
}
