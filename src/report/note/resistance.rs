//! The note's RC shell resistance parts: the inputs (subsection 2.5) and the results
//! section (utilisation M_Ed / M_Rd along the height, fatigue damage of the vertical bars),
//! each number with the clause it comes from.

use std::fmt::Write as _;

use super::markup::{heads, n, num, sci, t, Cell, Table};
use crate::case::DesignFactors;
use crate::report::ReportInput;
use crate::resistance::actions::ResistanceResults;

/// Subsection 2.5: the resistance inputs as validated.
pub(super) fn write_inputs(out: &mut String, input: &ReportInput) {
    out.push_str("<h3>2.5 Reinforced-concrete resistance inputs</h3>\n");
    let Some(r) = &input.case.resistance else {
        out.push_str("<p>No [reinforcement] given: the resistance checks are skipped.</p>\n");
        return;
    };
    let f = r.factors;
    let rows = vec![
        vec![
            t("concrete f_ck (MPa)"),
            n(num(r.concrete_strength_pa / 1e6, 1)),
        ],
        vec![t("steel f_yk (MPa)"), n(num(r.steel_strength_pa / 1e6, 1))],
        vec![t("steel E_s (GPa)"), n(num(r.steel_modulus_pa / 1e9, 1))],
        vec![t("γ_c (EN 1992-1-1 2.4.2.4)"), n(num(f.gamma_c, 3))],
        vec![t("γ_s (EN 1992-1-1 2.4.2.4)"), n(num(f.gamma_s, 3))],
        vec![t("α_cc (EN 1992-1-1 3.1.6)"), n(num(f.alpha_cc, 3))],
        vec![
            t("γ_G,sup (EN 1990 Table A1.2(B))"),
            n(num(f.gamma_g_sup, 3)),
        ],
        vec![
            t("γ_G,inf (EN 1990 Table A1.2(B))"),
            n(num(f.gamma_g_inf, 3)),
        ],
        vec![t("γ_Q (EN 1990 Table A1.2(B))"), n(num(f.gamma_q, 3))],
        vec![t("γ_F,fat (EN 1992-1-1 6.8.4)"), n(num(f.gamma_f_fat, 3))],
        vec![
            t("γ_S,fat (EN 1992-1-1 Table 2.1N)"),
            n(num(f.gamma_s_fat, 3)),
        ],
    ];
    Table {
        head: heads(&["quantity", "value"]),
        rows,
    }
    .write(out);
    Table {
        head: heads(&[
            "from z (m)",
            "to z (m)",
            "outer ratio ρ_o (-)",
            "inner ratio ρ_i (-)",
            "outer cover (m)",
            "inner cover (m)",
        ]),
        rows: r
            .zones
            .iter()
            .map(|z| {
                vec![
                    n(num(z.from_z_m, 2)),
                    n(num(z.to_z_m, 2)),
                    n(num(z.outer_ratio, 5)),
                    n(num(z.inner_ratio, 5)),
                    n(num(z.outer_cover_m, 3)),
                    n(num(z.inner_cover_m, 3)),
                ]
            })
            .collect(),
    }
    .write(out);
}

/// The results section body; `f` the partial factors the check used (the fatigue ones are
/// printed where the damage is explained).
pub(super) fn write(out: &mut String, r: &ResistanceResults, f: &DesignFactors) {
    out.push_str(
        "<p>At every mesh node: N_Ed = γ_G N_G from the self-weight above (shell, lining when \
         installed, point masses; g = 9.80665 m/s²), checked with γ_G,inf and γ_G,sup, the one \
         giving the smaller M_Rd governing. M_Rd(N_Ed) by strain compatibility of the annulus \
         (EN 1992-1-1 6.1: plane sections, concrete parabola-rectangle 3.1.7 with Table 3.1 \
         strains, steel bilinear 3.2.7 with a horizontal top branch, bars smeared into two \
         rings, concrete tension ignored), integrated to 1e-8 relative. Utilisation = \
         M_Ed / M_Rd with M_Ed = load factor × characteristic moment of each action. The \
         vortex inertia moments (EN 1991-1-4 E.1.4) take γ_Q: they are characteristic effects \
         of a wind action (EN 1990 Table A1.2(B)).</p>\n",
    );
    let _ = writeln!(
        out,
        "<p>Fatigue: stress range of the vertical bars on the cracked elastic section (no \
         concrete tension, the shell's E for the concrete) between +M and −M of each vortex \
         mode at constant characteristic N_G; damage D = n / N with the straight-bar S-N \
         curve of EN 1992-1-1 6.8.4 Table 6.3N: N = N* (Δσ_Rsk / (γ_F,fat γ_S,fat Δσ))^k, \
         N* = 10⁶, Δσ_Rsk = 162.5 MPa, k = k₁ = 5 where N ≤ N* (γ_F,fat Δσ ≥ Δσ_Rsk / \
         γ_S,fat), k₂ = 9 where N > N*; γ_F,fat = {} (EN 1992-1-1 6.8.4 (1), [design] \
         gamma_f_fat), γ_S,fat = {} (EN 1992-1-1 Table 2.1N, [design] gamma_s_fat); n = the \
         mode's cycle count (EN 1991-1-4 E.1.5.2.6); the modes' damages are summed per \
         height.</p>",
        num(f.gamma_f_fat, 3),
        num(f.gamma_s_fat, 3)
    );
    let rows: Vec<Vec<Cell>> = r
        .stages
        .iter()
        .map(|s| {
            let g = s.governing.as_ref();
            let u = g.map_or(0.0, |g| g.utilisation);
            let cell = |ok: bool, v: String| if ok { n(v) } else { Cell::Bad(v) };
            vec![
                t(&s.stage),
                cell(u <= 1.0, g.map_or("-".into(), |g| num(g.utilisation, 3))),
                n(g.map_or("-".into(), |g| num(g.z_m, 1))),
                t(g.map_or("no action".into(), |g| g.action.clone())),
                cell(s.damage <= 1.0, sci(s.damage)),
                n(num(s.damage_z_m, 1)),
            ]
        })
        .collect();
    Table {
        head: heads(&[
            "stage",
            "max utilisation M_Ed/M_Rd (-)",
            "at z (m)",
            "governing action",
            "fatigue damage D (-)",
            "at z (m)",
        ]),
        rows,
    }
    .write(out);
    let _ = writeln!(
        out,
        "<p>Fatigue damage summed over the stages (each stage's worst height): {}.</p>",
        sci(r.total_damage)
    );
    let mut rows = Vec::new();
    for s in &r.stages {
        for m in &s.fatigue {
            rows.push(vec![
                t(&s.stage),
                n(m.mode.to_string()),
                n(sci(m.cycles)),
                n(num(m.z_m, 1)),
                n(num(m.stress_range_pa / 1e6, 2)),
                n(sci(m.damage)),
            ]);
        }
    }
    if !rows.is_empty() {
        Table {
            head: heads(&[
                "stage",
                "mode",
                "cycles n (-)",
                "worst z (m)",
                "bar stress range Δσ (MPa)",
                "damage D (-)",
            ]),
            rows,
        }
        .write(out);
    }
    let mut rows = Vec::new();
    for s in &r.stages {
        for a in &s.actions {
            rows.push(vec![
                t(&s.stage),
                t(&a.name),
                n(num(a.load_factor, 3)),
                t(&a.factor_source),
            ]);
        }
    }
    if !rows.is_empty() {
        Table {
            head: heads(&["stage", "action", "load factor (-)", "source of the factor"]),
            rows,
        }
        .write(out);
    }
}
