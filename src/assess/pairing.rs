//! Every available aircraft at every airfield: takeoff, climb and landing on the
//! runway in use (and the best other end), the runway limits and the field's weather
//! limits for the aircraft's strictest category, and the headroom in degrees.
//!
//! This is the hot path. Each airfield's air and per-end winds are computed once per
//! report; each pairing locates its table cell once and shares it across the takeoff,
//! climb and (at equal mass) landing tables and every runway end. Nothing here
//! allocates per pairing.

use serde_json::{Value, json};

use super::leg::LegResult;
use super::leg::{
    Context, EndWind, FieldWx, Gap, Setup, TableValues, departure_with, landing_with,
    observation_for, table_values,
};
use super::limits::{self, Who};
use super::model::{EndModel, Model};
use super::perf;
use super::state::{State, verdict};
use crate::atmosphere::AirData;
use crate::ops::operator::Buffers;
use crate::ops::{Category, Leg, Ops, Status};

/// What decided a pairing's state.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum PairLimit {
    /// Nothing limits (no checks).
    None,
    /// A takeoff distance check.
    Takeoff,
    /// Rate or gradient of climb.
    Climb,
    /// A landing distance check.
    Landing,
    /// Crosswind.
    Crosswind,
    /// Tailwind.
    Tailwind,
    /// Density altitude.
    DensityAltitude,
    /// The field's weather (ceiling, visibility, wind, hazards, daylight).
    Weather,
    /// No usable report.
    Observation,
    /// Outside the flight-manual tables, or a correction the manual lacks.
    Table,
}

impl PairLimit {
    /// The unit of a cell's margin for this limiting check.
    pub const fn margin_unit(self) -> &'static str {
        match self {
            PairLimit::Takeoff | PairLimit::Climb | PairLimit::Landing => "%",
            PairLimit::Crosswind | PairLimit::Tailwind => "kt",
            PairLimit::DensityAltitude => "ft",
            PairLimit::None | PairLimit::Weather | PairLimit::Observation | PairLimit::Table => "",
        }
    }
}

/// One cell of the matrix.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PairCell {
    /// State on the runway in use.
    pub state: State,
    /// Margin ÷ buffer of the limiting check.
    pub score: f64,
    /// The limiting check's margin: percent for distances and climb, kt for wind, ft
    /// for density altitude ([`PairLimit::margin_unit`]).
    pub margin_percent: f64,
    /// What limits.
    pub limiting: PairLimit,
    /// The best state over every usable end.
    pub best_end_state: State,
    /// Index (in the field's ends) of the runway in use.
    pub end_in_use: Option<u8>,
    /// Degrees of warming left; `None` for no-data.
    pub headroom_c: Option<f64>,
}

impl PairCell {
    const NO_DATA: PairCell = PairCell {
        state: State::NoData,
        score: f64::NAN,
        margin_percent: f64::NAN,
        limiting: PairLimit::Observation,
        best_end_state: State::NoData,
        end_in_use: None,
        headroom_c: None,
    };
}

/// The matrix: available aircraft × airfields, aircraft-major.
#[derive(Debug, Clone)]
pub struct Matrix {
    /// Indices into `Ops::aircraft` of the rows.
    pub aircraft: Vec<usize>,
    /// Number of columns (airfields).
    pub fields: usize,
    /// Cells, `aircraft × fields`.
    pub cells: Vec<PairCell>,
    /// Per-aircraft data kept for column updates.
    prep: Prepared,
}

impl Matrix {
    /// The cell of row `ai` (index into `aircraft`) and airfield `fi`.
    pub fn cell(&self, ai: usize, fi: usize) -> &PairCell {
        &self.cells[ai * self.fields + fi]
    }

    /// JSON: one object per pairing.
    pub fn to_json(&self, ops: &Ops) -> Value {
        let mut rows = Vec::with_capacity(self.cells.len());
        for (ai, &a) in self.aircraft.iter().enumerate() {
            for fi in 0..self.fields {
                let c = self.cell(ai, fi);
                let field = &ops.airfields[fi];
                rows.push(json!({
                    "aircraft": ops.aircraft[a].registration,
                    "airfield": field.id,
                    "runway": c.end_in_use.and_then(|k| field.runway_ends.get(k as usize)).map(|e| e.designator.clone()),
                    "state": c.state,
                    "limiting": c.limiting,
                    "margin": c.margin_percent.is_finite().then_some(c.margin_percent),
                    "margin_unit": c.limiting.margin_unit(),
                    "best_end_state": c.best_end_state,
                    "headroom_c": c.headroom_c,
                }));
            }
        }
        Value::Array(rows)
    }

    /// The full chain behind a cell, on demand: the pairing assessed as a leg from and
    /// to the airfield at the reference time, with the cell's masses and category and no
    /// pilot (so no pilot's own limits). `ai` indexes `aircraft`, `fi` the airfields.
    pub fn open(&self, ctx: &Context<'_>, ai: usize, fi: usize) -> Option<LegResult> {
        let a = *self.aircraft.get(ai)?;
        let ops = ctx.ops;
        let field = ops.airfields.get(fi)?;
        let (tom, lm) = self.prep.masses(ctx.model, a, fi)?;
        let at = ctx.at.fixed_offset();
        let leg = Leg {
            id: format!("{} at {}", ops.aircraft[a].registration, field.id),
            departs_at: at,
            arrives_at: at,
            aircraft: ops.aircraft[a].registration.clone(),
            pilot: String::new(),
            category: self.prep.aircraft[a].category,
            from: field.id.clone(),
            to: field.id.clone(),
            takeoff_mass_kg: Some(tom),
            landing_mass_kg: Some(lm),
            loads: None,
            remarks: "pairing".to_string(),
        };
        Some(super::leg::assess(ctx, &leg, usize::MAX))
    }

    /// Recomputes one airfield's column (after a new report for it).
    pub fn update_field(&mut self, ctx: &Context<'_>, fi: usize) {
        if fi < self.fields {
            self.prep
                .fill_column(ctx, &self.aircraft, self.fields, fi, &mut self.cells);
        }
    }
}

/// Per airfield, computed once per report.
struct FieldPrep<'a> {
    index: usize,
    wx: Option<FieldWx>,
    winds: Vec<EndWind>,
    ends: &'a [EndModel],
    in_use: Option<usize>,
    /// Field-level weather state per category (ceiling, visibility, wind, hazards).
    weather: [(State, f64); 4],
    stale: bool,
}

fn cat_index(c: Category) -> usize {
    match c {
        Category::StudentSolo => 0,
        Category::Solo => 1,
        Category::Dual => 2,
        Category::Charter => 3,
    }
}

impl<'a> FieldPrep<'a> {
    fn new(ctx: &Context<'a>, fi: usize) -> FieldPrep<'a> {
        let ops = ctx.ops;
        let model = ctx.model;
        let field = &ops.airfields[fi];
        let ends = model.field_ends(fi);
        let found = observation_for(ctx.store, &field.id, ctx.at, ctx.at, model.stale_after_min);
        let wx = found
            .as_ref()
            .and_then(|(r, _)| FieldWx::from_report(r, field.elevation_ft));
        let stale = found.as_ref().is_some_and(|(_, u)| u.stale);
        let winds: Vec<EndWind> = match &wx {
            Some(wx) => ends.iter().map(|e| wx.on_end(e.heading_true_deg)).collect(),
            None => Vec::new(),
        };
        let usable = |k: &usize| ends.get(*k).is_some_and(|e| e.usable_at(ctx.at));
        let in_use = model.set_in_use[fi].filter(usable).or_else(|| {
            let wx = wx.as_ref()?;
            if wx.calm() {
                model.fields[fi]
                    .preferential_end
                    .filter(usable)
                    .or_else(|| (0..ends.len()).find(usable))
            } else {
                (0..ends.len())
                    .filter(usable)
                    .max_by(|&a, &b| winds[a].headwind_kt.total_cmp(&winds[b].headwind_kt))
            }
        });
        let mut weather = [(State::NoData, f64::NAN); 4];
        if let (Some((report, _)), Some(wx)) = (&found, &wx) {
            let sun = limits::sun(field, ctx.at);
            for c in Category::ALL {
                let Some(mins) = ops.minimums(c) else {
                    continue;
                };
                let who = Who {
                    category: c,
                    minimums: mins,
                    pilot: None,
                    regime: ops.operator.regime,
                    buffers: &ops.operator.policy.buffers,
                };
                let mut lim = Vec::new();
                limits::field_limits(
                    &who,
                    report,
                    wx.air.density_altitude_ft,
                    &sun,
                    ctx.at,
                    true,
                    &mut lim,
                );
                let mut st = (State::Within, f64::INFINITY);
                for l in lim
                    .iter()
                    .filter(|l| l.kind != limits::LimitKind::DensityAltitude)
                {
                    let s = l.score();
                    if l.state > st.0 || (l.state == st.0 && s < st.1) {
                        st = (l.state, s);
                    }
                }
                weather[cat_index(c)] = st;
            }
        }
        FieldPrep {
            index: fi,
            wx,
            winds,
            ends,
            in_use,
            weather,
            stale,
        }
    }
}

/// Type, takeoff and landing mass (bits) and category: what a cell depends on.
type CellKey = (Option<usize>, u64, u64, Category);

/// Per aircraft, computed once per matrix.
#[derive(Debug, Clone)]
struct AircraftPrep {
    ty: Option<usize>,
    category: Category,
    /// Takeoff mass per departure airfield of its legs (else MTOW).
    legs_from: Vec<(usize, f64)>,
    /// Landing mass per arrival airfield of its legs.
    legs_to: Vec<(usize, f64)>,
}

#[derive(Debug, Clone)]
struct Prepared {
    aircraft: Vec<AircraftPrep>,
    dist_buf: f64,
    climb_buf: f64,
}

impl Prepared {
    fn new(ctx: &Context<'_>) -> Prepared {
        let ops = ctx.ops;
        let model = ctx.model;
        let day = ctx.at.date_naive();
        let mut aircraft: Vec<AircraftPrep> = (0..ops.aircraft.len())
            .map(|i| AircraftPrep {
                ty: model.aircraft_type.get(i).copied().flatten(),
                category: model.strictest.unwrap_or(Category::StudentSolo),
                legs_from: Vec::new(),
                legs_to: Vec::new(),
            })
            .collect();
        let position: std::collections::HashMap<&str, usize> = ops
            .aircraft
            .iter()
            .enumerate()
            .map(|(i, a)| (a.registration.as_str(), i))
            .collect();
        let mut cats: Vec<Vec<Category>> = vec![Vec::new(); ops.aircraft.len()];
        for leg in ops
            .legs
            .iter()
            .filter(|l| l.departs_utc().date_naive() == day)
        {
            let Some(&i) = position.get(leg.aircraft.as_str()) else {
                continue;
            };
            cats[i].push(leg.category);
            let (tom, lm) = super::leg::leg_masses(ops, leg);
            if let (Some(fi), Some(m)) = (ops.airfield_position(&leg.from), tom) {
                aircraft[i].legs_from.push((fi, m));
            }
            if let (Some(fi), Some(m)) = (ops.airfield_position(&leg.to), lm) {
                aircraft[i].legs_to.push((fi, m));
            }
        }
        for (ap, cats) in aircraft.iter_mut().zip(cats) {
            // The strictest category the aircraft flies today, else the operator's.
            if let Some(c) = Category::ALL.into_iter().find(|c| cats.contains(c)) {
                ap.category = c;
            }
        }
        let b: &Buffers = &ops.operator.policy.buffers;
        Prepared {
            aircraft,
            dist_buf: b.distance_percent / 100.0,
            climb_buf: b.climb_percent / 100.0,
        }
    }

    /// Takeoff and landing mass of aircraft `a` at field `fi`: its leg's where it has
    /// one there, else the maximum takeoff mass (landing: held to the maximum landing mass).
    fn masses(&self, model: &Model, a: usize, fi: usize) -> Option<(f64, f64)> {
        let ap = &self.aircraft[a];
        let ty = model.types.get(ap.ty?)?;
        let tom = ap
            .legs_from
            .iter()
            .find(|(f, _)| *f == fi)
            .map_or(ty.max_takeoff_mass_kg, |&(_, m)| m);
        let lm = ap
            .legs_to
            .iter()
            .find(|(f, _)| *f == fi)
            .map_or(tom.min(ty.max_landing_mass_kg), |&(_, m)| m);
        Some((tom, lm))
    }

    /// What a cell depends on besides the field: equal keys give equal cells.
    fn key(&self, model: &Model, a: usize, fi: usize) -> CellKey {
        let ap = &self.aircraft[a];
        let (tom, lm) = self.masses(model, a, fi).unwrap_or((f64::NAN, f64::NAN));
        (ap.ty, tom.to_bits(), lm.to_bits(), ap.category)
    }

    /// Fills field `fi`'s column; aircraft alike in type, masses and category share
    /// one computation.
    fn fill_column(
        &self,
        ctx: &Context<'_>,
        aircraft: &[usize],
        fields: usize,
        fi: usize,
        cells: &mut [PairCell],
    ) {
        let field = FieldPrep::new(ctx, fi);
        let mut seen: Vec<(CellKey, PairCell)> = Vec::new();
        for (ai, &a) in aircraft.iter().enumerate() {
            let key = self.key(ctx.model, a, fi);
            let cell = match seen.iter().find(|(k, _)| *k == key) {
                Some((_, c)) => *c,
                None => {
                    let c = self.pair(ctx, &field, a);
                    seen.push((key, c));
                    c
                }
            };
            cells[ai * fields + fi] = cell;
        }
    }

    fn pair(&self, ctx: &Context<'_>, field: &FieldPrep<'_>, a: usize) -> PairCell {
        let ops = ctx.ops;
        let model = ctx.model;
        let ap = &self.aircraft[a];
        let (Some(t), Some(wx), Some(in_use)) = (ap.ty, field.wx.as_ref(), field.in_use) else {
            return PairCell::NO_DATA;
        };
        if field.stale {
            return PairCell::NO_DATA;
        }
        let Some(mins) = ops.minimums(ap.category) else {
            return PairCell::NO_DATA;
        };
        let ty = &model.types[t];
        let perf = &ops.types[t].performance;
        let Some((tom, lm)) = self.masses(model, a, field.index) else {
            return PairCell::NO_DATA;
        };
        let b = &ops.operator.policy.buffers;
        let setup = Setup {
            model,
            ty,
            perf,
            mins,
            takeoff_mass_kg: tom,
            landing_mass_kg: lm,
            distance_buffer: self.dist_buf,
            climb_buffer: self.climb_buf,
        };
        // One cell lookup for this air, shared by every runway end.
        let eval = |k: usize, air: &AirData, tv: &Result<TableValues, Gap>| -> Outcome {
            evaluate(&setup, b, &field.ends[k], air, tv, &field.winds[k])
        };
        let tv0 = table_values(&setup, &wx.air);
        let weather = field.weather[cat_index(ap.category)];
        let now = eval(in_use, &wx.air, &tv0);
        let mut best = now.state;
        for k in 0..field.ends.len() {
            if k != in_use && field.ends[k].usable_at(ctx.at) {
                best = best.min(eval(k, &wx.air, &tv0).state);
            }
        }
        let (mut state, mut score, mut limiting, mut margin) =
            (now.state, now.score, now.limiting, now.margin_percent);
        if weather.0 > state || (weather.0 == state && weather.1 < score) {
            state = weather.0;
            score = weather.1;
            limiting = PairLimit::Weather;
            margin = f64::NAN;
        }
        // Wind limits do not change with temperature: the search judges only the rest.
        let headroom_c = match now.state {
            State::NoData => None,
            _ => super::headroom::search(
                |dt| {
                    let air = wx.air.with_oat(wx.air.oat_c + dt);
                    eval(in_use, &air, &table_values(&setup, &air)).temperature_score
                },
                ty.oat_top_c - wx.air.oat_c,
                ty.oat_bottom_c - wx.air.oat_c,
            )
            .map(|f| f.warming_c),
        };
        PairCell {
            state,
            score,
            margin_percent: margin,
            limiting,
            best_end_state: best.and(weather.0),
            end_in_use: u8::try_from(in_use).ok(),
            headroom_c,
        }
    }
}

#[derive(Debug, Clone, Copy)]
struct Outcome {
    state: State,
    score: f64,
    margin_percent: f64,
    limiting: PairLimit,
    /// The smallest margin ÷ buffer of the temperature-dependent checks (distances,
    /// climb, density altitude); `None` when the tables do not cover the point.
    temperature_score: Option<f64>,
}

impl Outcome {
    /// A limit with `margin` to spare in its unit and a thin `band` in the same unit.
    fn limit(&mut self, margin: f64, band: f64, what: PairLimit) {
        self.add(verdict(margin, band), margin / band, margin, what);
    }

    fn add(&mut self, state: State, score: f64, margin_percent: f64, what: PairLimit) {
        if state > self.state || (state == self.state && score < self.score) {
            *self = Outcome {
                state,
                score,
                margin_percent,
                limiting: what,
                temperature_score: self.temperature_score,
            };
        }
        if !matches!(what, PairLimit::Crosswind | PairLimit::Tailwind) {
            self.temperature_score = match (self.temperature_score, state) {
                (_, State::NoData) | (None, _) => None,
                (Some(t), _) => Some(t.min(score)),
            };
        }
    }
}

#[inline]
fn evaluate(
    s: &Setup<'_>,
    b: &Buffers,
    end: &EndModel,
    air: &AirData,
    tv: &Result<TableValues, Gap>,
    w: &EndWind,
) -> Outcome {
    let (ty, mins) = (s.ty, s.mins);
    let (dist_buf, climb_buf) = (s.distance_buffer, s.climb_buffer);
    let mut o = Outcome {
        state: State::Within,
        score: f64::INFINITY,
        margin_percent: f64::INFINITY,
        limiting: PairLimit::None,
        temperature_score: Some(f64::INFINITY),
    };
    let tv = match tv {
        Ok(tv) => Some(tv),
        Err(_) => {
            o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table);
            None
        }
    };
    match tv.map(|tv| departure_with(s, tv, end, air, w.headwind_kt)) {
        Some(Ok((chain, climb))) => {
            let m = perf::min_margin(&chain, end, &mins.takeoff_checks, 1.0);
            o.add(
                verdict(m, dist_buf),
                m / dist_buf,
                m * 100.0,
                PairLimit::Takeoff,
            );
            let c = climb.margin();
            o.add(
                verdict(c, climb_buf),
                c / climb_buf,
                c * 100.0,
                PairLimit::Climb,
            );
        }
        Some(Err(_)) => o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table),
        None => {}
    }
    match tv.map(|tv| landing_with(s, tv, end, w.headwind_kt)) {
        Some(Ok(chain)) => {
            let extra = perf::landing_extra_factor(&chain, mins.wet_paved_landing_factor);
            let m = perf::min_margin(&chain, end, &mins.landing_checks, extra);
            o.add(
                verdict(m, dist_buf),
                m / dist_buf,
                m * 100.0,
                PairLimit::Landing,
            );
        }
        Some(Err(_)) => o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table),
        None => {}
    }
    let max_x = mins.max_crosswind_kt.min(ty.max_demonstrated_crosswind_kt);
    o.limit(max_x - w.crosswind_kt, b.wind_kt, PairLimit::Crosswind);
    o.limit(
        mins.max_tailwind_kt - w.tailwind_limit_kt,
        b.wind_kt,
        PairLimit::Tailwind,
    );
    o.limit(
        mins.max_density_altitude_ft - air.density_altitude_ft,
        b.density_altitude_ft,
        PairLimit::DensityAltitude,
    );
    o
}

/// The whole matrix.
pub fn matrix(ctx: &Context<'_>) -> Matrix {
    let ops = ctx.ops;
    let prep = Prepared::new(ctx);
    let aircraft: Vec<usize> = (0..ops.aircraft.len())
        .filter(|&i| ops.aircraft[i].status == Status::Available)
        .collect();
    let fields = ops.airfields.len();
    let mut cells = vec![PairCell::NO_DATA; aircraft.len() * fields];
    for fi in 0..fields {
        prep.fill_column(ctx, &aircraft, fields, fi, &mut cells);
    }
    Matrix {
        aircraft,
        fields,
        cells,
        prep,
    }
}
