//! Section 3 of the note: the method, and table 3.1, every constant whose value was not
//! read from the published standard, rendered from [`crate::wind::constants::registry`].

use super::markup::{heads, t, Table};
use crate::case::VortexMethod;

pub(super) fn method_name(m: VortexMethod) -> &'static str {
    match m {
        VortexMethod::En1991E1 => "EN 1991-1-4 Annex E, approach 1 (E.1.5.2)",
        VortexMethod::En1991E2 => "EN 1991-1-4 Annex E, approach 2 (E.1.5.3)",
        VortexMethod::Gb50009H1 => "GB 50009-2012 Appendix H.1",
    }
}

/// The method text (our own wording; clauses of the standards named).
pub(super) const METHOD: &str = r#"
<p>The shell is modelled as a cantilever of Hermite beam elements (mesh nodes at every
station, lining end and point mass; consistent mass). With the Timoshenko option the elements
include shear deformation with Cowper's shear coefficient for a thin-walled hollow circular
section (G. R. Cowper, <i>The shear coefficient in Timoshenko's beam theory</i>, J. Appl. Mech.
33, 1966) and rotary inertia. Lining and point masses add mass only. Modes are found by an
eigen-solver whose completeness is proven by a Sturm count (section 4).</p>
<p>Vortex shedding is checked per stage and mode at the mode's largest antinode (the shedding
section) by EN 1991-1-4:2005 Annex E:</p>
<ul>
<li>E.1.3.1: critical speed v_crit = b n / St, with St = 0.18 for a circular section;</li>
<li>E.1.2: no further check when v_crit &gt; 1.25 v_m (mean speed at the shedding section);
v_m is the stage's own design speed, the site's 50-year speed times c_prob of the stage's
return period (EN 1991-1-4 4.2(2)P, expression (4.2); for a construction stage by default the
return period of EN 1991-1-6 Table 3.1 for its duration);</li>
<li>E.1.3.3 and E.1.3.4: Scruton number Sc = 2 delta_s m_e / (rho b^2) with the structural log
decrement of the stage (default vortex.log_decrement) and the equivalent mass (F.14), Reynolds
number Re = b v_crit / nu;</li>
<li>E.1.5.2 (approach 1): peak amplitude from c_lat (Figure E.2, Table E.3), correlation length
(Table E.4) and the factors K and K_W (E.8, E.9) integrated over the computed mode shape;</li>
<li>E.1.5.3 (approach 2): peak amplitude from the standard deviation with the constants C_c,
K_a and a_L and the peak factor;</li>
<li>E.1.4: inertia forces F(z) = m(z) (2 pi n)^2 y(z), from which shear, bending moment and
extreme-fibre stress follow; fatigue cycles by E.1.5.2.6 / E.1.5.3, counted over the
stage's duration (in service: the design life) with v_0 from the site's 50-year speed.</li>
</ul>
<p>GB 50009-2012 Appendix H.1 (critical speed, Reynolds regimes and the equivalent resonance
load) is computed for comparison; it governs only if chosen.</p>
<p><b>Constants not read from the published standard.</b> Several constants were
implemented without the standard's text at hand. Table 3.1 lists each of them with its value,
where it is used and what it has been checked against since: a public copy of the
standard ("confirmed"), or nothing ("from memory"). Check the "from memory" rows against the
standard and National Annex in force.</p>
<p><b>Our own indicator.</b> The lock-in band (heights where the local critical speed
b(z) n / St lies below the local mean speed v_m(z)) is our own addition to show where along a
tapered shell shedding could lock in; it is not a code method and does not enter any verdict.</p>
"#;

/// The method text and table 3.1.
pub(super) fn write(out: &mut String) {
    out.push_str(METHOD);
    out.push_str("<h3>3.1 Constants not read from the published standard</h3>\n");
    let mut table = String::new();
    Table {
        head: heads(&["constant", "value", "used in", "status", "checked against"]),
        rows: crate::wind::constants::registry()
            .into_iter()
            .map(|e| {
                vec![
                    t(e.name),
                    t(e.value),
                    t(e.used_in),
                    t(e.status.label()),
                    t(e.checked_against),
                ]
            })
            .collect(),
    }
    .write(&mut table);
    // A long table of text: full width with set column widths, allowed to break across pages.
    out.push_str(&table.replacen(
        "<table>",
        "<table class=\"constants\"><colgroup><col style=\"width: 22%\" />\
         <col style=\"width: 25%\" /><col style=\"width: 17%\" />\
         <col style=\"width: 10%\" /><col style=\"width: 26%\" /></colgroup>",
        1,
    ));
}
