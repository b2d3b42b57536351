//! The beam model of one construction stage: mesh, elements, banded mass and stiffness,
//! point masses and base springs.
//!
//! Mesh: nodes on every station (a wall step is one node with a section on each side),
//! lining end, concrete-zone limit, opening limit, point mass and the stage top, then each
//! segment between such nodes split evenly so that the total element count reaches the
//! requested minimum (elements spread in proportion to segment length).
//!
//! DOF numbering: node i (z ascending from the base) owns dofs 4i (w, m) and 4i + 1
//! (theta, rad); element e's bubble amplitudes are dofs 4e + 2 (m) and 4e + 3 (rad). A rigid
//! base direction is a removed dof (kept in the vectors as a zero).
//!
//! Openings: an element inside an opening's height range uses the net section of
//! [`crate::section::opening`] (area for the mass, the smaller principal second moment for
//! bending and rotary inertia). Its shear stiffness is k A_net G with Cowper's k of the full
//! annulus: no published coefficient for a cut annulus was found, and shear is a correction
//! there (our assumption, stated in the design note).

use crate::case::{BeamTheory, Case, Lining, LiningMass, Stage};
use crate::section::opening::{net_section, Cut, NetSection};
use crate::section::Annulus;

use rayon::prelude::*;

use super::band::{SymBand, HALF_BAND};
use super::element::{Element, ElementProperties};

/// Default element count: about 10 elements per requested mode (with a floor of 30) keeps
/// every requested frequency within ~1e-6 of the converged value on the demo stack, far
/// below the 0.01 % promise (measured in tests/fem_default_mesh_accuracy.rs; the bubble
/// elements converge at least as h^4).
pub fn default_elements(modes: usize) -> usize {
    (10 * modes).max(30)
}

/// One row of a symmetric band: A[i][i + k], k = 0..=HALF_BAND.
type BandRow = [f64; HALF_BAND + 1];

/// Meshes with more nodes than this integrate their elements in parallel.
const PARALLEL_ELEMENTS: usize = 1000;

/// An opening that cuts an element: clear width (m) and azimuth (rad).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OpeningCut {
    pub width_m: f64,
    pub azimuth_rad: f64,
}

/// Section and material data of one element, linear in the local coordinate.
#[derive(Debug, Clone, PartialEq)]
pub struct ElementData {
    pub z_bottom_m: f64,
    pub length_m: f64,
    pub outer_diameter_bottom_m: f64,
    pub outer_diameter_top_m: f64,
    pub wall_bottom_m: f64,
    pub wall_top_m: f64,
    pub elastic_modulus_pa: f64,
    pub shear_modulus_pa: f64,
    pub poisson_ratio: f64,
    pub density_kg_m3: f64,
    pub timoshenko: bool,
    /// Lining mass per metre on this element as c0 + c_d D + c_t t (kg/m, kg/m2, kg/m2):
    /// every lining form is linear in the shell's D and t, so the sum over the zones that
    /// cover the element is exact.
    pub lining_coefficients: [f64; 3],
    /// Openings over the whole element (empty for almost every element).
    pub openings: Vec<OpeningCut>,
}

impl ElementData {
    /// Annulus at local coordinate s (0 = bottom node).
    pub fn annulus(&self, s_m: f64) -> Annulus {
        let t = s_m / self.length_m;
        Annulus::new(
            self.outer_diameter_bottom_m
                + t * (self.outer_diameter_top_m - self.outer_diameter_bottom_m),
            self.wall_bottom_m + t * (self.wall_top_m - self.wall_bottom_m),
        )
    }

    /// Net section at s: the annulus minus the element's openings. The validated case
    /// guarantees the cuts fit (see `input::validate`); should they not, the gross annulus
    /// is never used silently: the area and stiffness become NaN and the solver refuses.
    pub fn net_section(&self, s_m: f64) -> NetSection {
        let a = self.annulus(s_m);
        let cuts: Result<Vec<Cut>, _> = self
            .openings
            .iter()
            .map(|o| Cut::new(o.width_m, o.azimuth_rad, a.outer_diameter_m))
            .collect();
        match cuts.and_then(|c| net_section(&a, &c)) {
            Ok(n) => n,
            Err(_) => NetSection {
                area_m2: f64::NAN,
                centroid_m: [f64::NAN; 2],
                second_moment_max_m4: f64::NAN,
                second_moment_min_m4: f64::NAN,
                min_axis_angle_rad: f64::NAN,
                extreme_fibre_m: f64::NAN,
            },
        }
    }

    /// (area m2, second moment m4) of the section at s: the net values at openings.
    fn area_and_second_moment(&self, s_m: f64) -> (Annulus, f64, f64) {
        let a = self.annulus(s_m);
        if self.openings.is_empty() {
            (a, a.area_m2(), a.second_moment_m4())
        } else {
            let n = self.net_section(s_m);
            (a, n.area_m2, n.second_moment_min_m4)
        }
    }

    /// Shell mass per metre at s, kg/m.
    pub fn shell_mass_kg_m(&self, s_m: f64) -> f64 {
        self.density_kg_m3 * self.area_and_second_moment(s_m).1
    }

    /// Lining mass per metre at s, kg/m.
    pub fn lining_mass_kg_m(&self, s_m: f64) -> f64 {
        let a = self.annulus(s_m);
        let [c0, cd, ct] = self.lining_coefficients;
        c0 + cd * a.outer_diameter_m + ct * a.wall_m
    }
}

impl ElementProperties for ElementData {
    fn bending_stiffness_nm2(&self, s_m: f64) -> f64 {
        self.elastic_modulus_pa * self.area_and_second_moment(s_m).2
    }

    fn shear_stiffness_n(&self, s_m: f64) -> f64 {
        if !self.timoshenko {
            return f64::INFINITY;
        }
        let (a, area, _) = self.area_and_second_moment(s_m);
        a.cowper_shear_coefficient(self.poisson_ratio) * self.shear_modulus_pa * area
    }

    fn mass_per_length_kg_m(&self, s_m: f64) -> f64 {
        self.shell_mass_kg_m(s_m) + self.lining_mass_kg_m(s_m)
    }

    fn rotary_inertia_kg_m(&self, s_m: f64) -> f64 {
        if self.timoshenko {
            self.density_kg_m3 * self.area_and_second_moment(s_m).2
        } else {
            0.0
        }
    }

    fn compliance_rates(&self, s_m: f64) -> (f64, f64) {
        let (a, area, second_moment) = self.area_and_second_moment(s_m);
        let inv_ei = 1.0 / (self.elastic_modulus_pa * second_moment);
        if !self.timoshenko {
            return (inv_ei, 0.0);
        }
        let kga = a.cowper_shear_coefficient(self.poisson_ratio) * self.shear_modulus_pa * area;
        (inv_ei, 1.0 / kga)
    }

    fn relative_variation(&self) -> f64 {
        let dd = (self.outer_diameter_top_m - self.outer_diameter_bottom_m).abs()
            / self.outer_diameter_bottom_m.min(self.outer_diameter_top_m);
        let dt =
            (self.wall_top_m - self.wall_bottom_m).abs() / self.wall_bottom_m.min(self.wall_top_m);
        // I ~ D^3 t for thin walls: the variation of EI is ~3 dD/D + dt/t.
        let gross = 3.0 * dd + dt;
        if self.openings.is_empty() {
            return gross;
        }
        // The net I also moves with beta = asin(w / D): measure its change end to end and
        // keep a factor 2 of margin for the curvature in between.
        let (i0, i1) = (
            self.area_and_second_moment(0.0).2,
            self.area_and_second_moment(self.length_m).2,
        );
        gross.max(2.0 * (i0 - i1).abs() / i0.min(i1))
    }
}

/// What the K^-1 recursion needs of one element.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OperatorData {
    pub length_m: f64,
    /// [f_ww, f_wt, f_tt] of the element clamped at its lower node.
    pub flexibility: [f64; 3],
    /// Inverse of the bubble stiffness block [b11, b12, b22].
    pub bubble_flexibility: [f64; 3],
}

/// The assembled beam model of one stage.
#[derive(Debug, Clone)]
pub struct BeamModel {
    /// Node heights, m.
    pub z_m: Vec<f64>,
    pub element_data: Vec<ElementData>,
    pub elements: Vec<Element>,
    /// The per-element data of the K^-1 recursion, kept compact for cache use.
    pub operator: Vec<OperatorData>,
    /// Consistent mass incl. point masses, kg (band over all dofs; removed dofs zeroed).
    pub mass: SymBand,
    /// Stiffness incl. base springs (band over all dofs; removed dofs as identity rows).
    pub stiffness: SymBand,
    /// Concentrated masses lumped to nodes: (node index, kg); not the foundation mass, which
    /// is only in `mass`.
    pub point_masses: Vec<(usize, f64)>,
    /// Concentrated rotary inertias at nodes: (node index, kg m2); the foundation's at node
    /// 0 when the base can rotate.
    pub point_rotary_inertias: Vec<(usize, f64)>,
    /// Base spring stiffnesses: lateral N/m and rotational N m/rad; `None` = rigid.
    pub base_lateral_n_per_m: Option<f64>,
    pub base_rotational_nm_per_rad: Option<f64>,
}

/// Mesh node heights for a stage: required nodes, then even subdivision.
pub fn mesh_nodes(case: &Case, stage: &Stage, min_elements: usize) -> Vec<f64> {
    let height = stage.height_m(&case.shell);
    let mut required = vec![0.0, height];
    for s in &case.shell.stations {
        if s.z_m > 0.0 && s.z_m < height {
            required.push(s.z_m);
        }
    }
    if stage.lining {
        for l in &case.linings {
            for z in [l.from_z_m, l.to_z_m] {
                if z > 0.0 && z < height {
                    required.push(z);
                }
            }
        }
    }
    for p in case
        .point_masses
        .iter()
        .filter(|p| p.is_in_stage(&stage.name))
    {
        if p.z_m > 0.0 && p.z_m < height {
            required.push(p.z_m);
        }
    }
    let zone_limits = case.shell.zones.iter().map(|z| (z.from_z_m, z.to_z_m));
    let opening_limits = case.shell.openings.iter().map(|o| (o.from_z_m, o.to_z_m));
    for (from, to) in zone_limits.chain(opening_limits) {
        for z in [from, to] {
            if z > 0.0 && z < height {
                required.push(z);
            }
        }
    }
    required.sort_by(|a, b| a.total_cmp(b));
    let tol = 1e-9 * height;
    required.dedup_by(|a, b| (*a - *b).abs() <= tol);
    let target = min_elements.max(required.len() - 1);
    let mut nodes = vec![0.0];
    for w in required.windows(2) {
        let len = w[1] - w[0];
        let n = ((target as f64 * len / height).round() as usize).max(1);
        for k in 1..=n {
            nodes.push(if k == n {
                w[1]
            } else {
                w[0] + len * k as f64 / n as f64
            });
        }
    }
    nodes
}

impl BeamModel {
    /// Builds the model of `stage`. `min_elements` = None uses [`default_elements`].
    pub fn build(case: &Case, stage: &Stage, min_elements: Option<usize>, modes: usize) -> Self {
        let requested = min_elements.unwrap_or_else(|| default_elements(modes));
        // At least two elements per requested mode so the dof count exceeds the subspace.
        let z_m = mesh_nodes(case, stage, requested.max(2 * modes + 4));
        let shell = &case.shell;
        let timoshenko = shell.beam == BeamTheory::Timoshenko;
        let n_nodes = z_m.len();
        let data_of = |w: &[f64]| {
            // At a wall step the element above starts on the upper station's section and the
            // element below ends on the lower one's.
            let (d0, t0) = shell.geometry_above(w[0]);
            let (d1, t1) = shell.geometry_at(w[1]);
            let mid = 0.5 * (w[0] + w[1]);
            let material = shell.material_at(mid);
            let openings = shell
                .openings_at(mid)
                .map(|o| OpeningCut {
                    width_m: o.width_m,
                    azimuth_rad: o.azimuth_rad,
                })
                .collect();
            let mut lining_coefficients = [0.0; 3];
            if stage.lining {
                for l in case
                    .linings
                    .iter()
                    .filter(|l| l.from_z_m <= mid && mid <= l.to_z_m)
                {
                    let c = lining_coefficients_of(l);
                    for k in 0..3 {
                        lining_coefficients[k] += c[k];
                    }
                }
            }
            ElementData {
                z_bottom_m: w[0],
                length_m: w[1] - w[0],
                outer_diameter_bottom_m: d0,
                outer_diameter_top_m: d1,
                wall_bottom_m: t0,
                wall_top_m: t1,
                elastic_modulus_pa: material.elastic_modulus_pa * stage.stiffness_factor,
                shear_modulus_pa: material.shear_modulus_pa() * stage.stiffness_factor,
                poisson_ratio: material.poisson_ratio,
                density_kg_m3: material.density_kg_m3,
                timoshenko,
                lining_coefficients,
                openings,
            }
        };
        let element_data: Vec<ElementData> = if n_nodes > PARALLEL_ELEMENTS {
            z_m.par_windows(2).map(data_of).collect()
        } else {
            z_m.windows(2).map(data_of).collect()
        };
        let mut mass = SymBand::zeros(4 * n_nodes - 2);
        let mut stiffness = SymBand::zeros(4 * n_nodes - 2);
        // Element e owns band rows 4e..4e + 4 (its lower node and bubbles) and shares its
        // upper node's rows with element e + 1: it writes its own rows in place and hands
        // back the upper-node 2x2 blocks, which are added in order afterwards. So elements
        // are integrated and assembled independently (on all cores for fine meshes; small
        // meshes stay on the calling thread, which in a sweep is already one of many) and
        // the 6x6 matrices never leave the thread that computed them.
        let one = |((m_rows, k_rows), data): ((&mut [BandRow], &mut [BandRow]), &ElementData)| {
            let (el, matrices) = Element::integrate(data, data.length_m);
            let own = |rows: &mut [BandRow], a: &[[f64; 6]; 6]| {
                for i in 0..4 {
                    for j in i..6 {
                        rows[i][j - i] += a[i][j];
                    }
                }
            };
            own(m_rows, &matrices.mass);
            own(k_rows, &matrices.stiffness);
            let upper = |a: &[[f64; 6]; 6]| [a[4][4], a[4][5], a[5][5]];
            (el, upper(&matrices.mass), upper(&matrices.stiffness))
        };
        let integrated: Vec<_> = if n_nodes > PARALLEL_ELEMENTS {
            mass.rows_mut()
                .par_chunks_mut(4)
                .zip(stiffness.rows_mut().par_chunks_mut(4))
                .zip(element_data.par_iter())
                .map(one)
                .collect()
        } else {
            mass.rows_mut()
                .chunks_mut(4)
                .zip(stiffness.rows_mut().chunks_mut(4))
                .zip(element_data.iter())
                .map(one)
                .collect()
        };
        let mut elements = Vec::with_capacity(n_nodes - 1);
        for (e, (el, m_upper, k_upper)) in integrated.into_iter().enumerate() {
            let top = 4 * e + 4;
            for (band, [a44, a45, a55]) in [(&mut mass, m_upper), (&mut stiffness, k_upper)] {
                band.add(top, top, a44);
                band.add(top, top + 1, a45);
                band.add(top + 1, top + 1, a55);
            }
            elements.push(el);
        }
        let mut point_masses = Vec::new();
        let tol = 1e-9 * z_m[n_nodes - 1];
        let mut point_rotary_inertias = Vec::new();
        for p in case
            .point_masses
            .iter()
            .filter(|p| p.is_in_stage(&stage.name))
        {
            if let Some(i) = z_m.iter().position(|z| (z - p.z_m).abs() <= tol) {
                mass.add(4 * i, 4 * i, p.mass_kg);
                point_masses.push((i, p.mass_kg));
                if p.rotary_inertia_kg_m2 > 0.0 {
                    mass.add(4 * i + 1, 4 * i + 1, p.rotary_inertia_kg_m2);
                    point_rotary_inertias.push((i, p.rotary_inertia_kg_m2));
                }
            }
        }
        let lateral = case.base.and_then(|b| b.lateral_n_per_m);
        let rotational = case.base.and_then(|b| b.rotational_nm_per_rad);
        // The foundation's mass and rotary inertia move with the springs: on a rigid
        // direction they do not move at all (the reader warns that they are ignored).
        let inertia = case.base_inertia;
        if lateral.is_some() && inertia.mass_kg > 0.0 {
            // Not a point mass of the shell: it stays out of m_e and the inertia loads.
            mass.add(0, 0, inertia.mass_kg);
        }
        if rotational.is_some() && inertia.rotary_inertia_kg_m2 > 0.0 {
            mass.add(1, 1, inertia.rotary_inertia_kg_m2);
            point_rotary_inertias.push((0, inertia.rotary_inertia_kg_m2));
        }
        match lateral {
            Some(k) => stiffness.add(0, 0, k),
            None => {
                stiffness.set_identity_row(0);
                zero_row(&mut mass, 0);
            }
        }
        match rotational {
            Some(k) => stiffness.add(1, 1, k),
            None => {
                stiffness.set_identity_row(1);
                zero_row(&mut mass, 1);
            }
        }
        let operator = elements
            .iter()
            .map(|e| OperatorData {
                length_m: e.length_m,
                flexibility: e.flexibility,
                bubble_flexibility: e.bubble_flexibility,
            })
            .collect();
        BeamModel {
            operator,
            z_m,
            element_data,
            elements,
            mass,
            stiffness,
            point_masses,
            point_rotary_inertias,
            base_lateral_n_per_m: lateral,
            base_rotational_nm_per_rad: rotational,
        }
    }

    /// Number of dofs in the vectors (including removed base dofs).
    pub fn dofs(&self) -> usize {
        4 * self.z_m.len() - 2
    }

    /// Which dofs are free (not removed by a rigid base).
    pub fn is_free(&self, dof: usize) -> bool {
        match dof {
            0 => self.base_lateral_n_per_m.is_some(),
            1 => self.base_rotational_nm_per_rad.is_some(),
            _ => true,
        }
    }

    /// Number of free dofs.
    pub fn free_dofs(&self) -> usize {
        (0..self.dofs()).filter(|&d| self.is_free(d)).count()
    }
}

fn zero_row(band: &mut SymBand, i: usize) {
    let n = band.dim();
    for j in i.saturating_sub(super::band::HALF_BAND)..n.min(i + super::band::HALF_BAND + 1) {
        let v = band.get(i, j);
        if v != 0.0 {
            band.add(i, j, -v);
        }
    }
}

/// The lining mass per metre of one zone as c0 + c_d D + c_t t (see [`Lining`]).
fn lining_coefficients_of(l: &Lining) -> [f64; 3] {
    let pi = std::f64::consts::PI;
    match l.mass {
        LiningMass::PerLength {
            mass_per_length_kg_m,
        } => [mass_per_length_kg_m, 0.0, 0.0],
        LiningMass::PerArea {
            mass_per_area_kg_m2,
        } => [
            0.0,
            pi * mass_per_area_kg_m2,
            -2.0 * pi * mass_per_area_kg_m2,
        ],
        LiningMass::Layer {
            thickness_m,
            density_kg_m3,
            gap_m,
        } => {
            let c = density_kg_m3 * pi * thickness_m;
            [c * (-2.0 * gap_m - thickness_m), c, -2.0 * c]
        }
    }
}
