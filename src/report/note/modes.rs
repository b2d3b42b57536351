//! Section 4 of the note: natural modes per stage, with the completeness check.

use std::fmt::Write as _;

use super::markup::{heads, html_escape, n, num, sci, Table};
use crate::report::ReportInput;

pub(super) fn write(out: &mut String, input: &ReportInput) {
    for s in input.stages {
        let _ = writeln!(
            out,
            "<h3>Stage \"{}\" (height {} m, {} elements)</h3>",
            html_escape(&s.stage.name),
            num(s.model.height_m(), 2),
            s.elements
        );
        Table {
            head: heads(&[
                "mode i",
                "n<sub>i</sub> (Hz)",
                "T<sub>i</sub> (s)",
                "modal mass M<sub>i</sub> (kg)",
                "m<sub>i,e</sub> (kg/m) (F.14)",
                "zero crossings",
            ]),
            rows: s
                .modes
                .iter()
                .enumerate()
                .map(|(k, m)| {
                    vec![
                        n(m.number.to_string()),
                        n(num(m.frequency_hz, 4)),
                        n(num(m.period_s(), 3)),
                        n(sci(m.modal_mass_kg)),
                        n(num(m.equivalent_mass_kg_m, 0)),
                        n(s.check
                            .sign_changes
                            .get(k)
                            .map_or("-".into(), |c| c.to_string())),
                    ]
                })
                .collect(),
        }
        .write(out);
        let _ = writeln!(
            out,
            "<p class=\"small\">Completeness: a Sturm count finds {} eigenvalues below {} Hz, \
             {} modes reported; largest relative residual {:.1e}.</p>",
            s.check.sturm_count,
            num(
                s.check.shift_rad2_s2.sqrt() / (2.0 * std::f64::consts::PI),
                4
            ),
            s.check.modes_reported,
            s.check.max_relative_residual
        );
    }
}
