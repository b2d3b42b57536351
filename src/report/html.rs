//! report.html: the self-contained design note. Inline CSS and inline SVG only: no scripts,
//! no fonts, no links to anything outside the file, so it opens offline and prints on A4.
//! The markup is well-formed XML (every element closed, only numeric character references),
//! so it can be checked with an XML parser.
//!
//! Every piece of user-supplied text (title, stage names, point-mass labels, warnings that
//! quote them) goes through [`html_escape`]; the SVGs are escaped by their backend.
//!
//! Headings and layout are our own. Units: SI, with the unit in every column head.

use std::fmt::Write as _;

use super::svg::Plot;
use super::{ReportInput, CAUTIONS};
use crate::case::{BeamTheory, LiningMass, Profile, VortexMethod};
use crate::wind::ModeVortex;

/// Escapes text for HTML element content and attribute values.
pub fn html_escape(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            // Control characters other than tab/newline are not allowed in XML 1.0.
            c if (c as u32) < 0x20 && c != '\t' && c != '\n' => out.push('\u{fffd}'),
            c => out.push(c),
        }
    }
    out
}

const CSS: &str = r#"
@page { size: A4; margin: 16mm 14mm 18mm 14mm; }
html { font-family: "DejaVu Sans", "Liberation Sans", Arial, sans-serif; font-size: 10.5pt;
  color: #000; background: #fff; }
body { max-width: 190mm; margin: 0 auto; padding: 8mm 0; line-height: 1.35; }
h1 { font-size: 17pt; margin: 0 0 2mm 0; }
h2 { font-size: 13pt; margin: 7mm 0 2mm 0; border-bottom: 1.5px solid #000; }
h3 { font-size: 11pt; margin: 4mm 0 1.5mm 0; }
p.meta { margin: 0 0 4mm 0; color: #333; }
table { border-collapse: collapse; margin: 1.5mm 0 3mm 0; font-size: 8.5pt;
  page-break-inside: avoid; }
th, td { border: 0.6px solid #555; padding: 0.6mm 1.6mm; vertical-align: top; }
th { background: #e8e8e8; text-align: left; font-weight: bold; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.bad { font-weight: bold; }
.cautions { border: 1.5px solid #000; padding: 2mm 4mm; margin: 3mm 0; }
.cautions li { margin: 1mm 0; }
figure { margin: 3mm 0 5mm 0; page-break-inside: avoid; break-inside: avoid; }
figure svg { width: 100%; height: auto; display: block; }
figcaption { font-size: 9pt; margin-top: 1mm; }
.small { font-size: 8.5pt; }
section.major { page-break-before: always; break-before: page; }
footer { margin-top: 8mm; border-top: 1px solid #000; font-size: 8.5pt; padding-top: 2mm; }
@media print { body { padding: 0; max-width: none; } h2, h3 { page-break-after: avoid; } }
"#;

fn num(x: f64, digits: usize) -> String {
    if x.is_finite() {
        format!("{x:.digits$}")
    } else {
        "-".into()
    }
}

fn sci(x: f64) -> String {
    if x.is_finite() {
        format!("{x:.3e}")
    } else {
        "-".into()
    }
}

fn opt(x: Option<f64>, digits: usize) -> String {
    x.map_or_else(|| "-".into(), |v| num(v, digits))
}

/// A table of the note: text cells left-aligned, numbers right-aligned, failures bold.
struct Table<'a> {
    head: &'a [&'a str],
    rows: Vec<Vec<Cell>>,
}

enum Cell {
    Text(String),
    Num(String),
    Bad(String),
}

fn t(s: impl AsRef<str>) -> Cell {
    Cell::Text(s.as_ref().to_string())
}

fn n(s: String) -> Cell {
    Cell::Num(s)
}

impl Table<'_> {
    fn write(&self, out: &mut String) {
        out.push_str("<table><thead><tr>");
        for h in self.head {
            let _ = write!(out, "<th>{}</th>", html_escape(h));
        }
        out.push_str("</tr></thead><tbody>");
        for r in &self.rows {
            out.push_str("<tr>");
            for c in r {
                match c {
                    Cell::Text(s) => {
                        let _ = write!(out, "<td>{}</td>", html_escape(s));
                    }
                    Cell::Num(s) => {
                        let _ = write!(out, "<td class=\"n\">{}</td>", html_escape(s));
                    }
                    Cell::Bad(s) => {
                        let _ = write!(out, "<td class=\"bad\">{}</td>", html_escape(s));
                    }
                }
            }
            out.push_str("</tr>");
        }
        out.push_str("</tbody></table>\n");
    }
}

fn figure(out: &mut String, plot: &Plot, number: usize) {
    let svg = plot.svg.trim();
    let svg = match svg.find("<svg") {
        Some(i) => &svg[i..],
        None => svg,
    };
    let _ = writeln!(
        out,
        "<figure id=\"{}\">{svg}<figcaption>Figure {number}: {}</figcaption></figure>",
        html_escape(plot.file.trim_end_matches(".svg")),
        html_escape(&plot.caption)
    );
}

fn method_name(m: VortexMethod) -> &'static str {
    match m {
        VortexMethod::En1991E1 => "EN 1991-1-4 Annex E, approach 1 (E.1.5.2)",
        VortexMethod::En1991E2 => "EN 1991-1-4 Annex E, approach 2 (E.1.5.3)",
        VortexMethod::Gb50009H1 => "GB 50009-2012 Appendix H.1",
    }
}

fn inputs(out: &mut String, input: &ReportInput) {
    let c = input.case;
    out.push_str("<h3>2.1 Shell</h3>\n");
    Table {
        head: &["quantity", "value"],
        rows: vec![
            vec![
                t("elastic modulus E (GPa)"),
                n(num(c.shell.elastic_modulus_pa / 1e9, 2)),
            ],
            vec![t("density (kg/m3)"), n(num(c.shell.density_kg_m3, 0))],
            vec![t("Poisson's ratio (-)"), n(num(c.shell.poisson_ratio, 3))],
            vec![
                t("beam theory"),
                t(match c.shell.beam {
                    BeamTheory::Timoshenko => {
                        "Timoshenko (shear deformation, Cowper's coefficient, rotary inertia)"
                    }
                    BeamTheory::EulerBernoulli => "Euler-Bernoulli (bending only)",
                }),
            ],
            vec![t("height (m)"), n(num(c.shell.height_m(), 2))],
        ],
    }
    .write(out);
    Table {
        head: &["station", "z_m", "outer_diameter_m", "wall_m"],
        rows: c
            .shell
            .stations
            .iter()
            .enumerate()
            .map(|(i, s)| {
                vec![
                    n((i + 1).to_string()),
                    n(num(s.z_m, 2)),
                    n(num(s.outer_diameter_m, 3)),
                    n(num(s.wall_m, 3)),
                ]
            })
            .collect(),
    }
    .write(out);
    out.push_str("<h3>2.2 Lining, platforms and foundation</h3>\n");
    if c.linings.is_empty() {
        out.push_str("<p>No lining.</p>\n");
    } else {
        Table {
            head: &["lining zone", "from_z_m", "to_z_m", "mass given as"],
            rows: c
                .linings
                .iter()
                .enumerate()
                .map(|(i, l)| {
                    let how = match l.mass {
                        LiningMass::PerLength {
                            mass_per_length_kg_m,
                        } => format!("{mass_per_length_kg_m:.1} kg/m of height"),
                        LiningMass::PerArea {
                            mass_per_area_kg_m2,
                        } => format!("{mass_per_area_kg_m2:.1} kg/m2 of the shell's inner face"),
                        LiningMass::Layer {
                            thickness_m,
                            density_kg_m3,
                            gap_m,
                        } => format!(
                            "layer {thickness_m:.3} m thick, {density_kg_m3:.0} kg/m3, \
                             gap {gap_m:.3} m"
                        ),
                    };
                    vec![
                        n((i + 1).to_string()),
                        n(num(l.from_z_m, 2)),
                        n(num(l.to_z_m, 2)),
                        t(how),
                    ]
                })
                .collect(),
        }
        .write(out);
    }
    if !c.point_masses.is_empty() {
        Table {
            head: &["point mass", "z_m", "mass_kg"],
            rows: c
                .point_masses
                .iter()
                .map(|p| vec![t(&p.label), n(num(p.z_m, 2)), n(num(p.mass_kg, 0))])
                .collect(),
        }
        .write(out);
    }
    let base = match &c.base {
        None => "fixed base".to_string(),
        Some(b) => format!(
            "rotational spring {}; lateral spring {}",
            b.rotational_nm_per_rad
                .map_or("rigid".into(), |k| format!("{:.1} GN m/rad", k / 1e9)),
            b.lateral_n_per_m
                .map_or("rigid".into(), |k| format!("{:.1} MN/m", k / 1e6))
        ),
    };
    let _ = writeln!(out, "<p>Foundation: {}.</p>", html_escape(&base));
    out.push_str("<h3>2.3 Construction stages</h3>\n");
    Table {
        head: &[
            "stage",
            "lining installed",
            "stiffness factor",
            "shell top (m)",
        ],
        rows: c
            .stages
            .iter()
            .map(|s| {
                vec![
                    t(&s.name),
                    t(if s.lining { "yes" } else { "no" }),
                    n(num(s.stiffness_factor, 2)),
                    n(num(s.height_m(&c.shell), 2)),
                ]
            })
            .collect(),
    }
    .write(out);
    out.push_str("<h3>2.4 Wind and vortex-shedding settings</h3>\n");
    let profile = match input.vortex.wind.profile {
        Profile::Power { exponent } => format!("power law, exponent {exponent:.3}"),
        Profile::Log {
            roughness_m,
            z_min_m,
        } => format!(
            "logarithmic (EN 1991-1-4 4.3), z0 = {roughness_m:.3} m, z_min = {z_min_m:.1} m"
        ),
    };
    let mut rows = vec![
        vec![
            t("mean wind speed at reference height (m/s)"),
            n(num(input.vortex.wind.reference_speed_m_s, 2)),
        ],
        vec![
            t("reference height (m)"),
            n(num(input.vortex.wind.reference_height_m, 1)),
        ],
        vec![t("profile"), t(profile)],
        vec![
            t("air density (kg/m3)"),
            n(num(input.vortex.wind.air_density_kg_m3, 3)),
        ],
        vec![
            t("kinematic viscosity (m2/s)"),
            n(sci(input.vortex.wind.kinematic_viscosity_m2_s)),
        ],
        vec![t("governing method"), t(method_name(c.vortex.method))],
        vec![
            t("Strouhal number (-)"),
            t(c.vortex
                .strouhal
                .map_or("method default".into(), |s| num(s, 3))),
        ],
        vec![
            t("structural log decrement (-)"),
            n(num(c.vortex.log_decrement, 4)),
        ],
        vec![t("modes checked"), n(c.vortex.modes.to_string())],
        vec![
            t("design life (years)"),
            n(num(c.vortex.design_life_years, 0)),
        ],
    ];
    if let Some(g) = &c.vortex.group {
        rows.push(vec![
            t("group of stacks"),
            t(format!("{} in line, spacing {:.1} m", g.count, g.spacing_m)),
        ]);
    }
    let cr = &c.criteria;
    rows.push(vec![
        t("criterion: tip amplitude (m)"),
        t(cr.tip_amplitude_m.map_or("-".into(), |v| num(v, 3))),
    ]);
    rows.push(vec![
        t("criterion: tip amplitude / top diameter (-)"),
        t(cr.tip_amplitude_per_diameter
            .map_or("-".into(), |v| num(v, 3))),
    ]);
    rows.push(vec![
        t("criterion: extreme-fibre stress (MPa)"),
        t(cr.stress_pa.map_or("-".into(), |v| num(v / 1e6, 2))),
    ]);
    Table {
        head: &["setting", "value"],
        rows,
    }
    .write(out);
}

const METHOD: &str = r#"<p>The shell is modelled as a cantilever of Hermite beam elements (mesh nodes at every
station, lining end and point mass; consistent mass). With the Timoshenko option the elements
include shear deformation with Cowper's shear coefficient for a thin-walled hollow circular
section (G. R. Cowper, <i>The shear coefficient in Timoshenko's beam theory</i>, J. Appl. Mech.
33, 1966) and rotary inertia. Lining and point masses add mass only. Modes are found by an
eigen-solver whose completeness is proven by a Sturm count (section 4).</p>
<p>Vortex shedding is checked per stage and mode at the mode's largest antinode (the shedding
section) by EN 1991-1-4:2005 Annex E:</p>
<ul>
<li>E.1.3.1: critical speed v_crit = b n / St, with St = 0.18 for a circular section;</li>
<li>E.1.2: no further check when v_crit &gt; 1.25 v_m (mean speed at the shedding section);</li>
<li>E.1.3.3 and E.1.3.4: Scruton number Sc = 2 delta_s m_e / (rho b^2) with the structural log
decrement and the equivalent mass (F.14), Reynolds number Re = b v_crit / nu;</li>
<li>E.1.5.2 (approach 1): peak amplitude from c_lat (Figure E.2, Table E.3), correlation length
(Table E.4) and the factors K and K_W (E.8, E.9) integrated over the computed mode shape;</li>
<li>E.1.5.3 (approach 2): peak amplitude from the standard deviation with the constants C_c,
K_a and a_L and the peak factor;</li>
<li>E.1.4: inertia forces F(z) = m(z) (2 pi n)^2 y(z), from which shear, bending moment and
extreme-fibre stress follow; fatigue cycles by E.1.5.2.6 / E.1.5.3.</li>
</ul>
<p>GB 50009-2012 Appendix H.1 (critical speed, Reynolds regimes and the equivalent resonance
load) is computed for comparison; it governs only if chosen.</p>
<p><b>From memory.</b> Several clause numbers and constants (among them Figure E.2's corner
values, the approach 2 constants and all of GB 50009 Appendix H.1) were implemented from memory
and have not all been verified against the published texts; they are marked in the source code.
Check them against the standard and National Annex in force.</p>
<p><b>Our own indicator.</b> The lock-in band (heights where the local critical speed
b(z) n / St lies below the local mean speed v_m(z)) is our own addition to show where along a
tapered shell shedding could lock in; it is not a code method and does not enter any verdict.</p>
"#;

fn modes_section(out: &mut String, input: &ReportInput) {
    for s in input.stages {
        let _ = writeln!(
            out,
            "<h3>Stage \"{}\" (height {} m, {} elements)</h3>",
            html_escape(&s.stage.name),
            num(s.model.height_m(), 2),
            s.elements
        );
        Table {
            head: &[
                "mode",
                "frequency_hz",
                "period_s",
                "modal_mass_kg",
                "equivalent_mass_kg_m",
                "zero crossings",
            ],
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

fn band(m: &ModeVortex) -> String {
    match &m.lock_in_band {
        Some(b) => format!("{:.0}-{:.0}", b.from_z_m, b.to_z_m),
        None => "none".into(),
    }
}

/// The verdict in one word (the reasons of an exceedance are listed under the table).
fn verdict_cell(m: &ModeVortex) -> Cell {
    if m.verdict.is_exceeds() {
        Cell::Bad("exceeds".into())
    } else {
        t(m.verdict.to_string())
    }
}

fn exceedances(out: &mut String, modes: &[ModeVortex]) {
    let bad: Vec<&ModeVortex> = modes.iter().filter(|m| m.verdict.is_exceeds()).collect();
    if bad.is_empty() {
        return;
    }
    out.push_str("<ul class=\"small\">\n");
    for m in bad {
        let _ = writeln!(
            out,
            "<li><b>Mode {}</b>: {}</li>",
            m.mode,
            html_escape(&m.verdict.to_string())
        );
    }
    out.push_str("</ul>\n");
}

fn verdict_section(out: &mut String, input: &ReportInput) {
    let _ = writeln!(
        out,
        "<p>Governing method: {}. The other methods are listed for comparison.</p>",
        method_name(input.case.vortex.method)
    );
    for s in &input.vortex.stages {
        let _ = writeln!(out, "<h3>Stage \"{}\"</h3>", html_escape(&s.stage));
        Table {
            head: &[
                "mode",
                "frequency_hz",
                "ref_height_m",
                "diameter_m",
                "strouhal",
                "v_crit_m_s",
                "v_mean_m_s",
                "speed_ratio",
                "reynolds",
                "scruton",
                "lock_in_band_m",
                "verdict",
            ],
            rows: s
                .modes
                .iter()
                .map(|m| {
                    vec![
                        n(m.mode.to_string()),
                        n(num(m.frequency_hz, 4)),
                        n(num(m.reference_height_m, 1)),
                        n(num(m.diameter_m, 2)),
                        n(num(m.strouhal, 3)),
                        n(num(m.critical_speed_m_s, 2)),
                        n(num(m.mean_speed_m_s, 2)),
                        n(num(m.speed_ratio, 2)),
                        n(sci(m.reynolds)),
                        n(num(m.scruton, 1)),
                        t(band(m)),
                        verdict_cell(m),
                    ]
                })
                .collect(),
        }
        .write(out);
        exceedances(out, &s.modes);
        let mut rows = Vec::new();
        for m in &s.modes {
            for c in &m.comparison {
                rows.push(vec![
                    n(m.mode.to_string()),
                    t(format!(
                        "{}{}",
                        c.method.key(),
                        if c.method == m.governing {
                            " (governing)"
                        } else {
                            ""
                        }
                    )),
                    t(if c.applies { "yes" } else { "no" }),
                    n(opt(c.tip_amplitude_m, 4)),
                    n(opt(c.base_moment_nm.map(|v| v / 1e6), 1)),
                    n(opt(c.max_stress_pa.map(|v| v / 1e6), 2)),
                    n(c.fatigue_cycles.map_or("-".into(), sci)),
                ]);
            }
        }
        out.push_str(
            "<p class=\"small\">Methods side by side (\"no\": screened out, or outside the \
             method's conditions).</p>\n",
        );
        Table {
            head: &[
                "mode",
                "method",
                "response computed",
                "tip_amplitude_m",
                "base_moment_mnm",
                "max_stress_mpa",
                "fatigue_cycles",
            ],
            rows,
        }
        .write(out);
    }
}

fn comparison_section(out: &mut String, input: &ReportInput) {
    let stages = &input.vortex.stages;
    let mut head: Vec<String> = vec!["mode".into(), "quantity".into()];
    head.extend(stages.iter().map(|s| s.stage.clone()));
    let head_ref: Vec<&str> = head.iter().map(String::as_str).collect();
    let n_modes = stages.iter().map(|s| s.modes.len()).max().unwrap_or(0);
    let mut rows = Vec::new();
    type Getter = fn(&ModeVortex) -> String;
    let quantities: [(&str, Getter); 4] = [
        ("frequency_hz", |m| num(m.frequency_hz, 4)),
        ("v_crit_m_s", |m| num(m.critical_speed_m_s, 2)),
        ("speed_ratio", |m| num(m.speed_ratio, 2)),
        ("tip_amplitude_m", |m| {
            opt(m.governing_summary().tip_amplitude_m, 4)
        }),
    ];
    for k in 1..=n_modes {
        for (name, get) in &quantities {
            let mut r = vec![n(k.to_string()), t(*name)];
            for s in stages {
                r.push(n(s
                    .modes
                    .iter()
                    .find(|m| m.mode == k)
                    .map_or("-".into(), get)));
            }
            rows.push(r);
        }
        let mut r = vec![n(k.to_string()), t("verdict")];
        for s in stages {
            r.push(
                s.modes
                    .iter()
                    .find(|m| m.mode == k)
                    .map_or(t("-"), verdict_cell),
            );
        }
        rows.push(r);
    }
    Table {
        head: &head_ref,
        rows,
    }
    .write(out);
}

fn loads_section(out: &mut String, input: &ReportInput) {
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
        head: &[
            "stage",
            "mode",
            "tip_amplitude_m",
            "base_shear_mn",
            "base_moment_mnm",
            "max_stress_mpa",
            "at z_m",
            "fatigue_cycles",
        ],
        rows,
    }
    .write(out);
    out.push_str(
        "<p class=\"small\">Loads of the governing method at the lock-in amplitude; the full \
         distributions along the height are in loads.csv.</p>\n",
    );
}

/// The remedy table: each remedy next to the unmitigated result of the same stage and mode.
fn remedy_section(o: &mut String, remedies: &crate::remedy::RemedyResults) {
    o.push_str(
        "<p>Each remedy is re-checked with the same EN 1991-1-4 Annex E functions as the \
         unmitigated stack; \"before\" is the unmitigated result. The tuned-mass-damper \
         damping is an equal-peak (Den Hartog) idealisation; the strake factor on c_lat is user \
         input (the standard gives none).</p>\n<table>\n<thead><tr><th>stage</th><th>mode</th>\
         <th>remedy</th><th>log decrement</th><th>Scruton</th><th>tip before (m)</th>\
         <th>tip after (m)</th><th>stress before (MPa)</th><th>stress after (MPa)</th>\
         <th>verdict before</th><th>verdict after</th></tr></thead>\n<tbody>\n",
    );
    let num = |v: Option<f64>, scale: f64, digits: usize| {
        v.map_or_else(|| "-".to_string(), |x| format!("{:.digits$}", x * scale))
    };
    let short = |v: &str| v.split(':').next().unwrap_or(v).to_string();
    let rows = remedies.rows();
    for r in &rows {
        let _ = writeln!(
            o,
            "<tr><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td>\
             <td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
            html_escape(&r.stage),
            r.mode,
            html_escape(&r.remedy),
            num(r.log_decrement, 1.0, 4),
            num(r.scruton, 1.0, 1),
            num(r.tip_amplitude_before_m, 1.0, 4),
            num(r.tip_amplitude_after_m, 1.0, 4),
            num(r.max_stress_before_pa, 1e-6, 2),
            num(r.max_stress_after_pa, 1e-6, 2),
            html_escape(&short(&r.verdict_before)),
            html_escape(&short(&r.verdict_after)),
        );
    }
    o.push_str("</tbody>\n</table>\n<ul>\n");
    for r in rows.iter().filter(|r| !r.note.is_empty()) {
        let _ = writeln!(
            o,
            "<li>{} mode {} ({}): {}</li>",
            html_escape(&r.stage),
            r.mode,
            html_escape(&r.remedy),
            html_escape(&r.note)
        );
    }
    o.push_str("</ul>\n");
}

/// Renders the design note. `date` is printed as given (ISO date), so tests can fix it.
pub fn render(input: &ReportInput, plots: &[Plot], date: &str) -> String {
    let plot = |file: &str| plots.iter().position(|p| p.file == file);
    let mut fig_no = 0;
    let mut put = |out: &mut String, file: &str| {
        if let Some(i) = plot(file) {
            fig_no += 1;
            figure(out, &plots[i], fig_no);
        }
    };
    let title = html_escape(&input.case.title);
    let mut o = String::new();
    let _ = write!(
        o,
        "<!DOCTYPE html>\n<html lang=\"en\" xmlns=\"http://www.w3.org/1999/xhtml\">\n<head>\n\
         <meta charset=\"utf-8\" />\n<title>{title}</title>\n<style>{CSS}</style>\n</head>\n<body>\n"
    );
    let _ = writeln!(o, "<h1>{title}</h1>");
    let _ = writeln!(
        o,
        "<p class=\"meta\">Vortex-shedding design note produced by stackwake {} on {}.</p>",
        env!("CARGO_PKG_VERSION"),
        html_escape(date)
    );
    o.push_str("<h2>1 Scope and cautions</h2>\n<p>This note screens the stack for across-wind vortex-shedding lock-in in the first modes of every construction stage and quantifies the response where lock-in can occur.</p>\n<div class=\"cautions\"><ul>\n");
    for c in CAUTIONS {
        let _ = writeln!(o, "<li>{}</li>", html_escape(c));
    }
    o.push_str("</ul></div>\n<h2>2 Inputs</h2>\n");
    inputs(&mut o, input);
    put(&mut o, "shell.svg");
    o.push_str("<section class=\"major\">\n<h2>3 Method</h2>\n");
    o.push_str(METHOD);
    o.push_str("</section>\n<section class=\"major\">\n<h2>4 Natural modes by stage</h2>\n");
    modes_section(&mut o, input);
    put(&mut o, "modes.svg");
    o.push_str("</section>\n<section class=\"major\">\n<h2>5 Vortex-shedding verdicts</h2>\n");
    verdict_section(&mut o, input);
    put(&mut o, "wind_map.svg");
    put(&mut o, "response.svg");
    o.push_str("</section>\n<section class=\"major\">\n<h2>6 Stage comparison</h2>\n");
    comparison_section(&mut o, input);
    put(&mut o, "stages.svg");
    o.push_str("</section>\n<section class=\"major\">\n<h2>7 Loads</h2>\n");
    loads_section(&mut o, input);
    put(&mut o, "envelopes.svg");
    o.push_str("</section>\n");
    let mut next = 8;
    if let Some(r) = input.remedies.filter(|r| !r.is_empty()) {
        let _ = writeln!(o, "<section class=\"major\">\n<h2>{next} Remedies</h2>");
        remedy_section(&mut o, r);
        o.push_str("</section>\n");
        next += 1;
    }
    if let Some(fragment) = input.model_plan_html {
        let _ = writeln!(
            o,
            "<section class=\"major\">\n<h2>{next} Aeroelastic model plan</h2>"
        );
        o.push_str(fragment);
        o.push_str("</section>\n");
        next += 1;
    }
    let _ = writeln!(o, "<h2>{next} Warnings</h2>");
    if input.warnings.is_empty() {
        o.push_str("<p>None.</p>\n");
    } else {
        o.push_str("<ul>\n");
        for w in input.warnings {
            let _ = writeln!(o, "<li>{}</li>", html_escape(w));
        }
        o.push_str("</ul>\n");
    }
    let _ = writeln!(
        o,
        "<footer>Screening tool: results must be checked by a licensed engineer against the \
         local code and the governing standard's National Annex. No warranty. Tables of this \
         note: modes.csv, vortex.csv, lock_in.csv, loads.csv, summary.json.</footer>\n</body>\n</html>"
    );
    o
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn escapes_markup_and_quotes() {
        assert_eq!(
            html_escape("<script>alert(1)</script> & \"x\" 'y'"),
            "&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;x&quot; &#39;y&#39;"
        );
    }
}
