//! The kernel as a function of the shell stiffness (for [`crate::risk::stiffness_family`]):
//! which fields are fixed, how the stiffness-dependent ones are combined from kernels at
//! interpolation points, and how far an interpolated kernel is from an exact one.
//! Units: those of [`ModeKernel`]'s fields.

use super::ModeKernel;

impl ModeKernel {
    /// Whether `other` is the same stage and mode with the same fixed data: everything
    /// that [`Self::interpolate_from`] does not write (shedding section, wind, criteria,
    /// plateau lengths and their wind, mesh). A family of kernels over the shell stiffness
    /// is valid only while this holds (the largest antinode may not move to another node).
    pub fn same_frame(&self, other: &ModeKernel) -> bool {
        let fixed = |k: &ModeKernel| {
            (
                k.stage_index,
                k.mode,
                k.diameter_m,
                k.top_diameter_m,
                k.antinode_z_m,
                k.strouhal,
                k.speed_factor,
                k.c_lat_group_factor,
                k.c_prob,
                [
                    k.plateaus[0].0,
                    k.plateaus[0].2,
                    k.plateaus[1].0,
                    k.plateaus[1].2,
                ],
            )
        };
        fixed(self) == fixed(other)
            && self.own_log_decrement == other.own_log_decrement
            && self.z_m == other.z_m
            && self.phi.len() == other.phi.len()
            && self.slope.len() == other.slope.len()
            && self.unit_stress_pa.len() == other.unit_stress_pa.len()
    }

    /// Writes into `self` the combination sum_j lambda_j (field of `node(j)`) of every
    /// field that depends on the shell stiffness when base springs hold the stack: the
    /// scalars ([`Self::interpolate_scalars_from`]) and the curves
    /// ([`Self::interpolate_curves_from`]). `self` must have the frame of the nodes
    /// ([`Self::same_frame`]).
    pub fn interpolate_from<'a>(&mut self, lambda: &[f64], node: impl Fn(usize) -> &'a ModeKernel) {
        self.interpolate_scalars_from(lambda, &node);
        self.interpolate_curves_from(lambda, &node);
    }

    /// The scalars: the frequency, equivalent mass and Scruton number, K, the plateaus'
    /// K_W and the tip ratio (all a screened-out sample needs).
    pub fn interpolate_scalars_from<'a>(
        &mut self,
        lambda: &[f64],
        node: impl Fn(usize) -> &'a ModeKernel,
    ) {
        let mut acc = [0.0f64; 7];
        for (j, &l) in lambda.iter().enumerate() {
            if l != 0.0 {
                let k = node(j);
                let v = [
                    k.frequency_hz,
                    k.scruton,
                    k.equivalent_mass_kg_m,
                    k.tip_per_antinode,
                    k.k,
                    k.plateaus[0].1,
                    k.plateaus[1].1,
                ];
                for (a, x) in acc.iter_mut().zip(v) {
                    *a += l * x;
                }
            }
        }
        [
            self.frequency_hz,
            self.scruton,
            self.equivalent_mass_kg_m,
            self.tip_per_antinode,
            self.k,
            self.plateaus[0].1,
            self.plateaus[1].1,
        ] = acc;
    }

    /// The curves: the shape and its slope and the unit stresses, whose largest magnitude
    /// becomes `stress_per_m`.
    pub fn interpolate_curves_from<'a>(
        &mut self,
        lambda: &[f64],
        node: impl Fn(usize) -> &'a ModeKernel,
    ) {
        let vectors = |out: &mut Vec<f64>, f: &dyn Fn(&ModeKernel) -> &[f64]| {
            out.iter_mut().for_each(|v| *v = 0.0);
            for (j, &l) in lambda.iter().enumerate() {
                if l != 0.0 {
                    for (o, &v) in out.iter_mut().zip(f(node(j))) {
                        *o += l * v;
                    }
                }
            }
        };
        vectors(&mut self.phi, &|k| &k.phi);
        vectors(&mut self.slope, &|k| &k.slope);
        vectors(&mut self.unit_stress_pa, &|k| &k.unit_stress_pa);
        self.stress_per_m = self.unit_stress_pa.iter().fold(0.0, |m, s| m.max(s.abs()));
    }

    /// Largest relative deviation of the stiffness-dependent fields of `self` from
    /// `exact`: each scalar relative to its exact value, each vector's entries relative to
    /// the vector's largest exact magnitude.
    pub fn deviation(&self, exact: &ModeKernel) -> f64 {
        let rel = |a: f64, b: f64| {
            if b == 0.0 {
                a.abs()
            } else {
                ((a - b) / b).abs()
            }
        };
        let vec_dev = |a: &[f64], b: &[f64]| {
            let scale = b.iter().fold(0.0, |m: f64, v| m.max(v.abs()));
            a.iter()
                .zip(b)
                .map(|(x, y)| (x - y).abs() / if scale > 0.0 { scale } else { 1.0 })
                .fold(0.0, f64::max)
        };
        let all = [
            rel(self.frequency_hz, exact.frequency_hz),
            rel(self.scruton, exact.scruton),
            rel(self.equivalent_mass_kg_m, exact.equivalent_mass_kg_m),
            rel(self.tip_per_antinode, exact.tip_per_antinode),
            rel(self.k, exact.k),
            rel(self.plateaus[0].1, exact.plateaus[0].1),
            rel(self.plateaus[1].1, exact.plateaus[1].1),
            rel(self.stress_per_m, exact.stress_per_m),
            vec_dev(&self.phi, &exact.phi),
            vec_dev(&self.slope, &exact.slope),
            vec_dev(&self.unit_stress_pa, &exact.unit_stress_pa),
        ];
        all.into_iter().fold(0.0, f64::max)
    }
}
