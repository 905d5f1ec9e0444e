//! Flight-manual performance tables and their multilinear interpolation.
//!
//! All of a type's tables (takeoff ground roll and distance to 50 ft, landing distance
//! from 50 ft and ground roll, rate of climb) live on one [`Grid`]: the same
//! `mass_kg` × `pressure_altitude_ft` × `oat_c` axes. A lookup therefore finds its cell
//! and its eight interpolation weights once ([`Grid::locate`] → [`Cell`]) and every
//! table is then read with eight multiply-adds ([`Table::at`]), with no allocation.
//! Outside the grid the answer is [`OutsideTable`], never an extrapolation.
//!
//! Values are stored contiguously, mass-major: index `(m · n_pa + p) · n_oat + t`.

use std::fmt;

/// One of the three table axes.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Axis {
    /// Aircraft mass, kg.
    Mass,
    /// Pressure altitude, ft.
    PressureAltitude,
    /// Outside air temperature, °C.
    Oat,
}

impl Axis {
    /// The JSON name of the axis.
    pub const fn field(self) -> &'static str {
        match self {
            Axis::Mass => "mass_kg",
            Axis::PressureAltitude => "pressure_altitude_ft",
            Axis::Oat => "oat_c",
        }
    }

    fn describe(self) -> (&'static str, &'static str) {
        match self {
            Axis::Mass => ("mass", "kg"),
            Axis::PressureAltitude => ("pressure altitude", "ft"),
            Axis::Oat => ("OAT", "°C"),
        }
    }
}

/// A lookup fell outside the manual's table on one axis.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
pub struct OutsideTable {
    /// The axis that was exceeded.
    pub axis: Axis,
    /// The value asked for.
    pub value: f64,
    /// The table's range on that axis, lowest and highest.
    pub range: (f64, f64),
}

impl fmt::Display for OutsideTable {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let (name, unit) = self.axis.describe();
        let (lo, hi) = self.range;
        let (p, lo, hi, v) = match self.axis {
            Axis::Oat => (1, lo, hi, self.value),
            _ => (0, lo, hi, self.value),
        };
        write!(
            f,
            "{name} {v:.p$} {unit} is outside the flight-manual table ({lo:.p$} to {hi:.p$} {unit})"
        )
    }
}

/// Why a grid could not be built.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum GridError {
    /// An axis has no points.
    #[error("axis {axis} is empty; give at least one value", axis = .0.field())]
    Empty(Axis),
    /// An axis value is not finite.
    #[error("axis {axis} holds a value that is not a finite number", axis = .0.field())]
    NotFinite(Axis),
    /// Axis values not strictly increasing.
    #[error("axis {axis} must be strictly increasing, but {next} follows {prev}", axis = .axis.field())]
    NotIncreasing {
        /// Which axis.
        axis: Axis,
        /// Index of the offending value.
        index: usize,
        /// Value before.
        prev: f64,
        /// Offending value.
        next: f64,
    },
    /// The grid is too large to index.
    #[error("grid has too many points ({0}); at most 1,000,000")]
    TooLarge(usize),
}

/// Why a table could not be built on its grid.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum TableError {
    /// Wrong number of entries at some nesting level.
    #[error("expected {expected} {what}, found {found}")]
    Shape {
        /// Where (e.g. `[1][3]`), relative to the table.
        at: String,
        /// What was being counted ("mass blocks", "pressure-altitude rows", "OAT columns").
        what: &'static str,
        /// Count the axes call for.
        expected: usize,
        /// Count found.
        found: usize,
    },
    /// A value is not finite.
    #[error("value is not a finite number")]
    NotFinite {
        /// Where, relative to the table.
        at: String,
    },
}

/// The shared axes of a type's tables.
#[derive(Debug, Clone, PartialEq)]
pub struct Grid {
    mass_kg: Vec<f64>,
    pressure_altitude_ft: Vec<f64>,
    oat_c: Vec<f64>,
}

/// Where a (mass, pressure altitude, OAT) point falls in a [`Grid`]: the eight corner
/// offsets and their weights. Found once, used for every table on the same grid.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Cell {
    offsets: [u32; 8],
    weights: [f64; 8],
    /// Number of points of the grid it came from: a cheap check that a table shares it.
    grid_len: u32,
}

impl Cell {
    /// The corner offsets into a table's flat values.
    pub const fn offsets(&self) -> &[u32; 8] {
        &self.offsets
    }

    /// The corner weights; they sum to 1.
    pub const fn weights(&self) -> &[f64; 8] {
        &self.weights
    }
}

/// Position of `x` on one axis: lower index, upper-index step (0 or 1) and fraction.
#[inline]
fn locate_axis(axis: Axis, points: &[f64], x: f64) -> Result<(usize, usize, f64), OutsideTable> {
    let n = points.len();
    let lo = points[0];
    let hi = points[n - 1];
    let outside = OutsideTable {
        axis,
        value: x,
        range: (lo, hi),
    };
    // NaN fails both comparisons, so it is refused here too.
    if !(x >= lo && x <= hi) {
        return Err(outside);
    }
    if n == 1 {
        return Ok((0, 0, 0.0));
    }
    // Axes are short (a manual has a handful of rows); a linear scan beats bisection.
    let mut i = 0;
    while i + 2 < n && x > points[i + 1] {
        i += 1;
    }
    let (a, b) = (points[i], points[i + 1]);
    Ok((i, 1, (x - a) / (b - a)))
}

impl Grid {
    /// Builds a grid, checking every axis is non-empty, finite and strictly increasing.
    pub fn new(
        mass_kg: Vec<f64>,
        pressure_altitude_ft: Vec<f64>,
        oat_c: Vec<f64>,
    ) -> Result<Grid, GridError> {
        for (axis, v) in [
            (Axis::Mass, &mass_kg),
            (Axis::PressureAltitude, &pressure_altitude_ft),
            (Axis::Oat, &oat_c),
        ] {
            check_axis(axis, v)?;
        }
        let n = mass_kg
            .len()
            .saturating_mul(pressure_altitude_ft.len())
            .saturating_mul(oat_c.len());
        if n > 1_000_000 {
            return Err(GridError::TooLarge(n));
        }
        Ok(Grid {
            mass_kg,
            pressure_altitude_ft,
            oat_c,
        })
    }

    /// Mass axis, kg.
    pub fn mass_kg(&self) -> &[f64] {
        &self.mass_kg
    }

    /// Pressure-altitude axis, ft.
    pub fn pressure_altitude_ft(&self) -> &[f64] {
        &self.pressure_altitude_ft
    }

    /// OAT axis, °C.
    pub fn oat_c(&self) -> &[f64] {
        &self.oat_c
    }

    /// Number of values a table on this grid holds.
    pub fn len(&self) -> usize {
        self.mass_kg.len() * self.pressure_altitude_ft.len() * self.oat_c.len()
    }

    /// Whether the grid has no points (never true for a built grid).
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }

    /// The range of one axis, lowest and highest.
    pub fn range(&self, axis: Axis) -> (f64, f64) {
        let v = match axis {
            Axis::Mass => &self.mass_kg,
            Axis::PressureAltitude => &self.pressure_altitude_ft,
            Axis::Oat => &self.oat_c,
        };
        (v[0], v[v.len() - 1])
    }

    /// Finds the cell and weights for a point; outside the grid on any axis is an error
    /// naming the axis (checked in the order mass, pressure altitude, OAT).
    ///
    /// An axis with a single point accepts only that exact value.
    #[inline]
    pub fn locate(
        &self,
        mass_kg: f64,
        pressure_altitude_ft: f64,
        oat_c: f64,
    ) -> Result<Cell, OutsideTable> {
        self.locate_slice(mass_kg, pressure_altitude_ft)?
            .at_oat(self, oat_c)
    }

    /// Locates a point on the mass and pressure-altitude axes only: a headroom search
    /// holds both and varies the OAT, so it locates them once and then calls
    /// [`Slice::at_oat`] per temperature, which gives exactly the [`Cell`] (bit for bit)
    /// that [`Grid::locate`] gives for the whole point.
    #[inline]
    pub fn locate_slice(
        &self,
        mass_kg: f64,
        pressure_altitude_ft: f64,
    ) -> Result<Slice, OutsideTable> {
        self.locate_mass(mass_kg)?.slice(self, pressure_altitude_ft)
    }

    /// Locates a mass on the mass axis only: a matrix holds an aircraft's mass at every
    /// airfield, so it locates it once and then calls [`MassAt::slice`] per pressure
    /// altitude, which gives exactly the [`Slice`] (bit for bit) of
    /// [`Grid::locate_slice`].
    #[inline]
    pub fn locate_mass(&self, mass_kg: f64) -> Result<MassAt, OutsideTable> {
        let (index, step, fraction) = locate_axis(Axis::Mass, &self.mass_kg, mass_kg)?;
        Ok(MassAt {
            index,
            step,
            fraction,
            grid_len: self.len() as u32,
        })
    }
}

/// A mass located on a [`Grid`]'s mass axis: lower index, upper-index step and
/// fraction, waiting for a pressure altitude ([`MassAt::slice`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MassAt {
    index: usize,
    step: usize,
    fraction: f64,
    /// Number of points of the grid it came from.
    grid_len: u32,
}

impl MassAt {
    /// The slice at `pressure_altitude_ft` on `grid` (the grid the mass was located on);
    /// outside the pressure-altitude axis is [`OutsideTable`].
    #[inline]
    pub fn slice(&self, grid: &Grid, pressure_altitude_ft: f64) -> Result<Slice, OutsideTable> {
        debug_assert_eq!(self.grid_len, grid.len() as u32, "another grid");
        let (mi, md, mf) = (self.index, self.step, self.fraction);
        let (pi, pd, pf) = locate_axis(
            Axis::PressureAltitude,
            &grid.pressure_altitude_ft,
            pressure_altitude_ft,
        )?;
        let n_t = grid.oat_c.len();
        let n_p = grid.pressure_altitude_ft.len();
        let base = (mi * n_p + pi) * n_t;
        let sm = md * n_p * n_t;
        let sp = pd * n_t;
        let mut bases = [0u32; 4];
        let mut weights = [0.0; 4];
        let mut k = 0;
        for (dm, wm) in [(0, 1.0 - mf), (sm, mf)] {
            for (dp, wp) in [(0, 1.0 - pf), (sp, pf)] {
                // Grids are capped at 1,000,000 points, so offsets fit in u32.
                bases[k] = (base + dm + dp) as u32;
                weights[k] = wm * wp;
                k += 1;
            }
        }
        Ok(Slice {
            bases,
            weights,
            grid_len: self.grid_len,
        })
    }
}

/// A point located on a [`Grid`]'s mass and pressure-altitude axes: four corner rows and
/// their weights, waiting for an OAT ([`Slice::at_oat`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Slice {
    bases: [u32; 4],
    weights: [f64; 4],
    grid_len: u32,
}

impl Slice {
    /// The cell at `oat_c` on this slice of `grid` (the grid it was located on); outside
    /// the OAT axis is [`OutsideTable`]. The weights are `(w_mass · w_pa) · w_oat`, the
    /// same products in the same order as a whole-point lookup.
    #[inline]
    pub fn at_oat(&self, grid: &Grid, oat_c: f64) -> Result<Cell, OutsideTable> {
        Ok(self.cell(&grid.locate_oat(oat_c)?))
    }

    /// The cell at an OAT located on the grid's OAT axis ([`Grid::locate_oat`]), so
    /// slices of one grid at one OAT (a takeoff and a landing mass) share the location:
    /// the [`Cell`] of [`Slice::at_oat`], bit for bit.
    #[inline]
    pub fn cell(&self, oat: &OatAt) -> Cell {
        let (ti, td, tf) = (oat.index, oat.step, oat.fraction);
        let mut offsets = [0u32; 8];
        let mut weights = [0.0; 8];
        for j in 0..4 {
            let base = self.bases[j] as usize + ti;
            offsets[2 * j] = base as u32;
            offsets[2 * j + 1] = (base + td) as u32;
            weights[2 * j] = self.weights[j] * (1.0 - tf);
            weights[2 * j + 1] = self.weights[j] * tf;
        }
        Cell {
            offsets,
            weights,
            grid_len: self.grid_len,
        }
    }
}

impl Slice {
    /// `N` columns from `FROM` on of rows laid out like a table's values (one row of
    /// `W` tables' values per grid point, `rows[offset][table]`), at an OAT on this
    /// slice: for each column `Σ value · weight` over the eight corners of
    /// [`Slice::cell`] in order from zero, the sum [`Table::at`] forms, bit for bit (a
    /// missing row reads as zeros), without building the cell.
    #[inline]
    pub fn read_rows<const W: usize, const FROM: usize, const N: usize>(
        &self,
        oat: &OatAt,
        rows: &[[f64; W]],
    ) -> [f64; N] {
        let (ti, td, tf) = (oat.index, oat.step, oat.fraction);
        let mut sum = [0.0; N];
        for j in 0..4 {
            let lo = self.bases[j] as usize + ti;
            let (w_lo, w_hi) = (self.weights[j] * (1.0 - tf), self.weights[j] * tf);
            let (v_lo, v_hi) = match rows.get(lo..=lo + td) {
                Some(r) => (r[0], r[td]),
                None => (
                    rows.get(lo).copied().unwrap_or([0.0; W]),
                    rows.get(lo + td).copied().unwrap_or([0.0; W]),
                ),
            };
            for c in 0..N {
                sum[c] += v_lo[FROM + c] * w_lo;
            }
            for c in 0..N {
                sum[c] += v_hi[FROM + c] * w_hi;
            }
        }
        sum
    }
}

/// An OAT located on a [`Grid`]'s OAT axis: lower index, upper-index step and fraction
/// ([`Grid::locate_oat`], [`Slice::cell`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OatAt {
    index: usize,
    step: usize,
    fraction: f64,
}

impl Grid {
    /// Locates an OAT on the OAT axis only; outside it is [`OutsideTable`].
    #[inline]
    pub fn locate_oat(&self, oat_c: f64) -> Result<OatAt, OutsideTable> {
        let (index, step, fraction) = locate_axis(Axis::Oat, &self.oat_c, oat_c)?;
        Ok(OatAt {
            index,
            step,
            fraction,
        })
    }
}

/// Which axes a conservative lookup held at the table's lowest value.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct Clamped {
    /// Mass below the lightest table mass: the lightest used.
    pub mass: bool,
    /// Pressure altitude below the lowest row: the lowest used.
    pub pressure_altitude: bool,
    /// OAT below the coldest column: the coldest used.
    pub oat: bool,
}

impl Clamped {
    /// Whether any axis was held.
    pub const fn any(self) -> bool {
        self.mass || self.pressure_altitude || self.oat
    }
}

impl Grid {
    /// Like [`Grid::locate`], but a value *below* an axis is held at the axis's lowest
    /// point (and reported in [`Clamped`]); above is still [`OutsideTable`].
    ///
    /// This is conservative for checked tables: validation requires distances not to
    /// fall, and climb rates not to rise, as mass, pressure altitude and OAT rise, so the
    /// lowest row gives a distance at least as long and a climb at most as good as the
    /// true (lighter, lower, colder) value. Typical use: a sea-level field under high
    /// pressure (negative pressure altitude) with a manual that starts at sea level.
    /// A table with `irregular_ok` is not monotonic; use [`Grid::locate`] for it.
    #[inline]
    pub fn locate_conservative(
        &self,
        mass_kg: f64,
        pressure_altitude_ft: f64,
        oat_c: f64,
    ) -> Result<(Cell, Clamped), OutsideTable> {
        let (m, cm) = self.hold_below(Axis::Mass, mass_kg);
        let (p, cp) = self.hold_below(Axis::PressureAltitude, pressure_altitude_ft);
        let (t, ct) = self.hold_below(Axis::Oat, oat_c);
        let cell = self.locate(m, p, t)?;
        Ok((
            cell,
            Clamped {
                mass: cm,
                pressure_altitude: cp,
                oat: ct,
            },
        ))
    }
}

impl Grid {
    /// A value below an axis's lowest point held at that point, and whether it was:
    /// the clamp of [`Grid::locate_conservative`], for callers that locate a
    /// [`Slice`] and then an OAT.
    #[inline]
    pub fn hold_below(&self, axis: Axis, x: f64) -> (f64, bool) {
        let lowest = self.range(axis).0;
        if x < lowest {
            (lowest, true)
        } else {
            (x, false)
        }
    }
}

fn check_axis(axis: Axis, v: &[f64]) -> Result<(), GridError> {
    if v.is_empty() {
        return Err(GridError::Empty(axis));
    }
    if v.iter().any(|x| !x.is_finite()) {
        return Err(GridError::NotFinite(axis));
    }
    for (i, w) in v.windows(2).enumerate() {
        if w[1] <= w[0] {
            return Err(GridError::NotIncreasing {
                axis,
                index: i + 1,
                prev: w[0],
                next: w[1],
            });
        }
    }
    Ok(())
}

/// One table's values on a [`Grid`], flat and mass-major.
#[derive(Debug, Clone, PartialEq)]
pub struct Table {
    values: Vec<f64>,
}

impl Table {
    /// Builds a table from the JSON nesting `[mass][pressure altitude][oat]`, checking
    /// the shape against the grid and every value finite.
    pub fn from_nested(grid: &Grid, nested: &[Vec<Vec<f64>>]) -> Result<Table, TableError> {
        let (nm, np, nt) = (
            grid.mass_kg.len(),
            grid.pressure_altitude_ft.len(),
            grid.oat_c.len(),
        );
        if nested.len() != nm {
            return Err(TableError::Shape {
                at: String::new(),
                what: "mass blocks (one per mass_kg value)",
                expected: nm,
                found: nested.len(),
            });
        }
        let mut values = Vec::with_capacity(grid.len());
        for (m, block) in nested.iter().enumerate() {
            if block.len() != np {
                return Err(TableError::Shape {
                    at: format!("[{m}]"),
                    what: "rows (one per pressure_altitude_ft value)",
                    expected: np,
                    found: block.len(),
                });
            }
            for (p, row) in block.iter().enumerate() {
                if row.len() != nt {
                    return Err(TableError::Shape {
                        at: format!("[{m}][{p}]"),
                        what: "columns (one per oat_c value)",
                        expected: nt,
                        found: row.len(),
                    });
                }
                for (t, v) in row.iter().enumerate() {
                    if !v.is_finite() {
                        return Err(TableError::NotFinite {
                            at: format!("[{m}][{p}][{t}]"),
                        });
                    }
                }
                values.extend_from_slice(row);
            }
        }
        Ok(Table { values })
    }

    /// Builds a table from flat, mass-major values (length must match the grid).
    pub fn from_flat(grid: &Grid, values: Vec<f64>) -> Result<Table, TableError> {
        if values.len() != grid.len() {
            return Err(TableError::Shape {
                at: String::new(),
                what: "values",
                expected: grid.len(),
                found: values.len(),
            });
        }
        Ok(Table { values })
    }

    /// The flat values, mass-major.
    pub fn values(&self) -> &[f64] {
        &self.values
    }

    /// The value at grid indices (mass, pressure altitude, OAT).
    pub fn get(&self, grid: &Grid, m: usize, p: usize, t: usize) -> f64 {
        let np = grid.pressure_altitude_ft.len();
        let nt = grid.oat_c.len();
        self.values[(m * np + p) * nt + t]
    }

    /// The interpolated value at a located cell. The cell must come from this table's
    /// grid (all of an aircraft type's tables share one).
    #[inline]
    pub fn at(&self, cell: &Cell) -> f64 {
        let mut sum = 0.0;
        for k in 0..8 {
            // A cell from a different-sized grid would index out of range; `get`
            // keeps that from becoming a panic and counts the corner as zero.
            let v = self
                .values
                .get(cell.offsets[k] as usize)
                .copied()
                .unwrap_or(0.0);
            sum += v * cell.weights[k];
        }
        sum
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    /// The whole-point lookup as it was before [`Slice`] (three axes and eight weights
    /// `wm · wp · wt` in one pass): the reference the split lookup must equal bit for bit.
    fn locate_reference(
        g: &Grid,
        mass_kg: f64,
        pa_ft: f64,
        oat_c: f64,
    ) -> Result<Cell, OutsideTable> {
        let (mi, md, mf) = locate_axis(Axis::Mass, &g.mass_kg, mass_kg)?;
        let (pi, pd, pf) = locate_axis(Axis::PressureAltitude, &g.pressure_altitude_ft, pa_ft)?;
        let (ti, td, tf) = locate_axis(Axis::Oat, &g.oat_c, oat_c)?;
        let n_t = g.oat_c.len();
        let n_p = g.pressure_altitude_ft.len();
        let base = (mi * n_p + pi) * n_t + ti;
        let (sm, sp, st) = (md * n_p * n_t, pd * n_t, td);
        let mut offsets = [0u32; 8];
        let mut weights = [0.0; 8];
        let mut k = 0;
        for (dm, wm) in [(0, 1.0 - mf), (sm, mf)] {
            for (dp, wp) in [(0, 1.0 - pf), (sp, pf)] {
                for (dt, wt) in [(0, 1.0 - tf), (st, tf)] {
                    offsets[k] = (base + dm + dp + dt) as u32;
                    weights[k] = wm * wp * wt;
                    k += 1;
                }
            }
        }
        Ok(Cell {
            offsets,
            weights,
            grid_len: g.len() as u32,
        })
    }

    fn axis(start: f64, steps: &[f64]) -> Vec<f64> {
        let mut v = vec![start];
        for s in steps {
            let last = *v.last().unwrap();
            v.push(last + s);
        }
        v
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(2000))]
        /// The split lookup (mass, then pressure altitude, then OAT) equals the
        /// whole-point reference, bit for bit, on random grids (one to six points an
        /// axis) and points in and around them; `Slice::read_rows` sums what the cell's
        /// corners and weights sum.
        #[test]
        fn slice_then_oat_equals_the_whole_point_lookup(
            m0 in 500.0f64..1500.0, m_steps in proptest::collection::vec(10.0f64..300.0, 0..3),
            p0 in -1000.0f64..2000.0, p_steps in proptest::collection::vec(100.0f64..3000.0, 0..5),
            t0 in -40.0f64..0.0, t_steps in proptest::collection::vec(1.0f64..20.0, 0..5),
            fm in -0.2f64..1.2, fp in -0.2f64..1.2, ft in -0.2f64..1.2,
        ) {
            let g = Grid::new(axis(m0, &m_steps), axis(p0, &p_steps), axis(t0, &t_steps)).unwrap();
            let at = |v: &[f64], f: f64| v[0] + f * (v[v.len() - 1] - v[0]);
            let (m, p, t) = (at(&g.mass_kg, fm), at(&g.pressure_altitude_ft, fp), at(&g.oat_c, ft));
            let want = locate_reference(&g, m, p, t);
            let got = g.locate(m, p, t);
            match (&want, &got) {
                (Ok(w), Ok(c)) => {
                    prop_assert_eq!(w.offsets, c.offsets);
                    for k in 0..8 {
                        prop_assert_eq!(w.weights[k].to_bits(), c.weights[k].to_bits());
                    }
                    // Reading rows straight off the slice sums what the cell sums.
                    let rows: Vec<[f64; 3]> = (0..g.len())
                        .map(|i| [i as f64 * 37.5 - 400.0, (i as f64).sqrt() * 91.0, 1e3 / (i as f64 + 1.0)])
                        .collect();
                    let slice = g.locate_slice(m, p).unwrap();
                    let got = slice.read_rows::<3, 1, 2>(&g.locate_oat(t).unwrap(), &rows);
                    for (col, got) in got.iter().enumerate() {
                        let mut want = 0.0;
                        for k in 0..8 {
                            want += rows[c.offsets[k] as usize][1 + col] * c.weights[k];
                        }
                        prop_assert_eq!(got.to_bits(), want.to_bits());
                    }
                }
                _ => prop_assert_eq!(want, got),
            }
            // On the grid's own points too (single-point axes accept only their value).
            let exact = g.locate(g.mass_kg[0], g.pressure_altitude_ft[0], g.oat_c[0]);
            prop_assert_eq!(exact, locate_reference(&g, g.mass_kg[0], g.pressure_altitude_ft[0], g.oat_c[0]));
        }
    }
}
