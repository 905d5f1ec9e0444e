//! The ICAO Standard Atmosphere (Doc 7488/3) and the air data of an observation:
//! station pressure, pressure altitude, ISA deviation, moist-air density and
//! density altitude.
//!
//! ## Altitudes
//!
//! The standard atmosphere is defined in **geopotential** altitude `H`; a tape
//! measure gives **geometric** altitude `z`. They are related by
//! `H = r₀·z / (r₀ + z)` with `r₀ = 6,356,766 m` (Doc 7488), and differ by under
//! 2 ft at 6,000 ft and about 60 ft at 30,000 ft. Every function here takes and
//! returns geopotential altitude unless its name says `geometric`.
//!
//! Pressure altitude and density altitude are geopotential by definition: an
//! altimeter is calibrated to the standard atmosphere's pressure–height relation.
//! A field elevation is used as the height an altimeter set to QNH reads on the
//! ground, which is the definition of QNH; no geometric correction is applied to it.
//!
//! ## What this module does not do
//!
//! It reads no clock and no file, and it does not validate inputs: callers check
//! ranges (see `rhoboard calc`). It covers the layers from −5 km to 47 km
//! geopotential (below −5 km the troposphere formula continues); the board uses
//! −2,000 ft to 65,000 ft.

use crate::units::{KELVIN_AT_0C, M_PER_FT, c_to_k};

/// Standard acceleration of gravity, m/s² (Doc 7488).
pub const G0_M_S2: f64 = 9.806_65;
/// Specific gas constant of dry air, J/(kg·K) (Doc 7488).
pub const R_DRY_J_KG_K: f64 = 287.052_87;
/// Specific gas constant of water vapour, J/(kg·K): R* / M_w = 8.314 462 618 / 0.018 015 28
/// (CODATA 2018 molar gas constant, molar mass of water).
pub const R_VAPOUR_J_KG_K: f64 = 8.314_462_618 / 0.018_015_28;
/// Sea-level standard temperature, K.
pub const SEA_LEVEL_TEMPERATURE_K: f64 = 288.15;
/// Sea-level standard pressure, hPa.
pub const SEA_LEVEL_PRESSURE_HPA: f64 = 1_013.25;
/// Sea-level standard density, kg/m³ (p₀ / (R·T₀) = 1.225 000 0).
pub const SEA_LEVEL_DENSITY_KG_M3: f64 =
    SEA_LEVEL_PRESSURE_HPA * 100.0 / (R_DRY_J_KG_K * SEA_LEVEL_TEMPERATURE_K);
/// Nominal Earth radius for geopotential altitude, m (Doc 7488).
pub const EARTH_RADIUS_M: f64 = 6_356_766.0;
/// The common-practice rule: density altitude rises about 120 ft for each °C above ISA.
pub const RULE_OF_THUMB_FT_PER_C: f64 = 120.0;

/// One layer of the standard atmosphere: base geopotential altitude, base temperature,
/// temperature gradient and base pressure.
#[derive(Debug, Clone, Copy)]
struct Layer {
    base_m: f64,
    base_temperature_k: f64,
    lapse_k_per_m: f64,
    base_pressure_pa: f64,
}

/// The ICAO layers to 47 km. Base pressures follow from the layer formulas with the
/// constants above (a test recomputes them); Doc 7488 prints 22 632.1, 5 474.89 and
/// 868.019 Pa.
const LAYERS: [Layer; 4] = [
    Layer {
        base_m: 0.0,
        base_temperature_k: 288.15,
        lapse_k_per_m: -0.0065,
        base_pressure_pa: 101_325.0,
    },
    Layer {
        base_m: 11_000.0,
        base_temperature_k: 216.65,
        lapse_k_per_m: 0.0,
        base_pressure_pa: 22_632.040_095_007_793,
    },
    Layer {
        base_m: 20_000.0,
        base_temperature_k: 216.65,
        lapse_k_per_m: 0.001,
        base_pressure_pa: 5_474.877_424_281_044,
    },
    Layer {
        base_m: 32_000.0,
        base_temperature_k: 228.65,
        lapse_k_per_m: 0.0028,
        base_pressure_pa: 868.015_776_620_215,
    },
];

impl Layer {
    fn temperature_k(&self, h_m: f64) -> f64 {
        self.base_temperature_k + self.lapse_k_per_m * (h_m - self.base_m)
    }

    fn pressure_pa(&self, h_m: f64) -> f64 {
        if self.lapse_k_per_m == 0.0 {
            self.base_pressure_pa
                * (-G0_M_S2 * (h_m - self.base_m) / (R_DRY_J_KG_K * self.base_temperature_k)).exp()
        } else {
            let ratio = self.temperature_k(h_m) / self.base_temperature_k;
            self.base_pressure_pa * ratio.powf(-G0_M_S2 / (R_DRY_J_KG_K * self.lapse_k_per_m))
        }
    }

    /// The altitude in this layer at which the pressure is `p_pa` (exact inverse).
    fn altitude_at_pressure_m(&self, p_pa: f64) -> f64 {
        let ratio = p_pa / self.base_pressure_pa;
        if self.lapse_k_per_m == 0.0 {
            self.base_m - R_DRY_J_KG_K * self.base_temperature_k / G0_M_S2 * ratio.ln()
        } else {
            let t =
                self.base_temperature_k * ratio.powf(-R_DRY_J_KG_K * self.lapse_k_per_m / G0_M_S2);
            self.base_m + (t - self.base_temperature_k) / self.lapse_k_per_m
        }
    }

    fn density_kg_m3(&self, h_m: f64) -> f64 {
        self.pressure_pa(h_m) / (R_DRY_J_KG_K * self.temperature_k(h_m))
    }

    fn base_density_kg_m3(&self) -> f64 {
        self.base_pressure_pa / (R_DRY_J_KG_K * self.base_temperature_k)
    }

    /// The altitude in this layer at which the standard density is `rho` (exact inverse).
    fn altitude_at_density_m(&self, rho: f64) -> f64 {
        let ratio = rho / self.base_density_kg_m3();
        if self.lapse_k_per_m == 0.0 {
            self.base_m - R_DRY_J_KG_K * self.base_temperature_k / G0_M_S2 * ratio.ln()
        } else {
            // ρ/ρb = (T/Tb)^-(1 + g0/(R·L))
            let exponent = -(1.0 + G0_M_S2 / (R_DRY_J_KG_K * self.lapse_k_per_m));
            let t = self.base_temperature_k * ratio.powf(1.0 / exponent);
            self.base_m + (t - self.base_temperature_k) / self.lapse_k_per_m
        }
    }
}

fn layer_for_altitude(h_m: f64) -> &'static Layer {
    // Few layers: a reverse linear scan is the fastest search.
    LAYERS
        .iter()
        .rev()
        .find(|l| h_m >= l.base_m)
        .unwrap_or(&LAYERS[0])
}

fn layer_for_pressure(p_pa: f64) -> &'static Layer {
    LAYERS
        .iter()
        .rev()
        .find(|l| p_pa <= l.base_pressure_pa)
        .unwrap_or(&LAYERS[0])
}

fn layer_for_density(rho: f64) -> &'static Layer {
    LAYERS
        .iter()
        .rev()
        .find(|l| rho <= l.base_density_kg_m3())
        .unwrap_or(&LAYERS[0])
}

/// Temperature, pressure and density of the standard atmosphere at one altitude.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Isa {
    /// Temperature, K.
    pub temperature_k: f64,
    /// Pressure, hPa.
    pub pressure_hpa: f64,
    /// Density, kg/m³.
    pub density_kg_m3: f64,
}

impl Isa {
    /// Temperature, °C.
    pub fn temperature_c(&self) -> f64 {
        self.temperature_k - KELVIN_AT_0C
    }
}

/// The standard atmosphere at geopotential altitude `h_m` (metres).
pub fn isa_at_geopotential_m(h_m: f64) -> Isa {
    let layer = layer_for_altitude(h_m);
    let temperature_k = layer.temperature_k(h_m);
    let pressure_pa = layer.pressure_pa(h_m);
    Isa {
        temperature_k,
        pressure_hpa: pressure_pa / 100.0,
        density_kg_m3: pressure_pa / (R_DRY_J_KG_K * temperature_k),
    }
}

/// Geopotential altitude for a geometric altitude, both in metres.
pub fn geopotential_from_geometric_m(z_m: f64) -> f64 {
    EARTH_RADIUS_M * z_m / (EARTH_RADIUS_M + z_m)
}

/// Geometric altitude for a geopotential altitude, both in metres.
pub fn geometric_from_geopotential_m(h_m: f64) -> f64 {
    EARTH_RADIUS_M * h_m / (EARTH_RADIUS_M - h_m)
}

/// ISA temperature at a pressure altitude, °C.
pub fn isa_temperature_c(pressure_altitude_ft: f64) -> f64 {
    let h_m = pressure_altitude_ft * M_PER_FT;
    layer_for_altitude(h_m).temperature_k(h_m) - KELVIN_AT_0C
}

/// The standard pressure at a pressure altitude, hPa.
pub fn pressure_at_pressure_altitude_hpa(pressure_altitude_ft: f64) -> f64 {
    let h_m = pressure_altitude_ft * M_PER_FT;
    layer_for_altitude(h_m).pressure_pa(h_m) / 100.0
}

/// Pressure altitude for a static pressure: the ISA altitude of that pressure, ft.
pub fn pressure_altitude_ft(pressure_hpa: f64) -> f64 {
    let p_pa = pressure_hpa * 100.0;
    layer_for_pressure(p_pa).altitude_at_pressure_m(p_pa) / M_PER_FT
}

/// Station pressure at a field from its altimeter setting (QNH), hPa.
///
/// By definition an altimeter set to QNH reads the field elevation on the ground, so
/// the field's pressure altitude is its elevation plus the pressure altitude of the
/// QNH pressure level (negative when QNH is above standard), and the station pressure
/// is the standard pressure at that pressure altitude.
pub fn station_pressure_hpa(elevation_ft: f64, qnh_hpa: f64) -> f64 {
    pressure_at_pressure_altitude_hpa(field_pressure_altitude_ft(elevation_ft, qnh_hpa))
}

/// The pressure altitude of a field from its elevation and altimeter setting, ft.
pub fn field_pressure_altitude_ft(elevation_ft: f64, qnh_hpa: f64) -> f64 {
    elevation_ft + pressure_altitude_ft(qnh_hpa)
}

/// Saturation vapour pressure over water at `temperature_c`, hPa: Bolton (1980),
/// *Mon. Wea. Rev.* 108, eq. 10, `6.112·exp(17.67·T / (T + 243.5))`, within 0.1 % from
/// −30 °C to +35 °C. At the dew point it gives the actual vapour pressure.
pub fn saturation_vapour_pressure_hpa(temperature_c: f64) -> f64 {
    6.112 * (17.67 * temperature_c / (temperature_c + 243.5)).exp()
}

/// Virtual temperature of moist air, K: the temperature dry air would need to have the
/// same density at the same pressure. `Tv = T / (1 − (e/p)(1 − ε))`, ε = R_d / R_v.
pub fn virtual_temperature_k(pressure_hpa: f64, temperature_c: f64, dewpoint_c: f64) -> f64 {
    virtual_temperature_from_vapour_k(
        pressure_hpa,
        temperature_c,
        saturation_vapour_pressure_hpa(dewpoint_c),
    )
}

/// [`virtual_temperature_k`] from the vapour pressure `e_hpa` itself.
#[inline]
fn virtual_temperature_from_vapour_k(pressure_hpa: f64, temperature_c: f64, e_hpa: f64) -> f64 {
    let epsilon = R_DRY_J_KG_K / R_VAPOUR_J_KG_K;
    c_to_k(temperature_c) / (1.0 - (e_hpa / pressure_hpa) * (1.0 - epsilon))
}

/// Air density from pressure, temperature and (optionally) dew point, kg/m³:
/// `ρ = p / (R_d·Tv)`, with `Tv = T` for dry air.
pub fn density_kg_m3(pressure_hpa: f64, temperature_c: f64, dewpoint_c: Option<f64>) -> f64 {
    let t_k = match dewpoint_c {
        Some(td) => virtual_temperature_k(pressure_hpa, temperature_c, td),
        None => c_to_k(temperature_c),
    };
    pressure_hpa * 100.0 / (R_DRY_J_KG_K * t_k)
}

/// Density altitude: the standard-atmosphere altitude with this density, ft (exact inverse).
pub fn density_altitude_ft(density_kg_m3: f64) -> f64 {
    layer_for_density(density_kg_m3).altitude_at_density_m(density_kg_m3) / M_PER_FT
}

/// The standard density at a geopotential altitude in feet, kg/m³.
pub fn isa_density_at_ft(altitude_ft: f64) -> f64 {
    let h_m = altitude_ft * M_PER_FT;
    layer_for_altitude(h_m).density_kg_m3(h_m)
}

/// The common-practice estimate: pressure altitude + 120 ft per °C above ISA. Shown only
/// as a cross-check beside the exact value.
pub fn density_altitude_rule_of_thumb_ft(pressure_altitude_ft: f64, oat_c: f64) -> f64 {
    pressure_altitude_ft
        + RULE_OF_THUMB_FT_PER_C * (oat_c - isa_temperature_c(pressure_altitude_ft))
}

/// True airspeed factor `1/√σ`: TAS = EAS·(1/√σ). For light aircraft at low speed the
/// indicated, calibrated and equivalent airspeeds are taken as equal (no compressibility
/// or position-error correction).
pub fn true_airspeed_factor(density_kg_m3: f64) -> f64 {
    (SEA_LEVEL_DENSITY_KG_M3 / density_kg_m3).sqrt()
}

/// Everything about the air at a field that follows from one observation.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct AirData {
    /// Field elevation used, ft.
    pub elevation_ft: f64,
    /// Altimeter setting (QNH), hPa.
    pub qnh_hpa: f64,
    /// Outside air temperature, °C.
    pub oat_c: f64,
    /// Dew point, °C, when reported.
    pub dewpoint_c: Option<f64>,
    /// Station pressure, hPa.
    pub station_pressure_hpa: f64,
    /// Pressure altitude, ft.
    pub pressure_altitude_ft: f64,
    /// ISA temperature at the pressure altitude, °C.
    pub isa_temperature_c: f64,
    /// OAT minus ISA temperature, °C.
    pub isa_deviation_c: f64,
    /// Air density (with humidity when a dew point is given), kg/m³.
    pub density_kg_m3: f64,
    /// Dry-air density, kg/m³.
    pub density_dry_kg_m3: f64,
    /// Density ratio σ = ρ/ρ₀.
    pub density_ratio: f64,
    /// Density altitude with humidity (equal to the dry value without a dew point), ft.
    pub density_altitude_ft: f64,
    /// Density altitude of dry air at the same pressure and temperature, ft.
    pub density_altitude_dry_ft: f64,
    /// The 120 ft/°C estimate, for comparison only, ft.
    pub density_altitude_rule_of_thumb_ft: f64,
    /// 1/√σ.
    pub true_airspeed_factor: f64,
}

impl AirData {
    /// The air at a field of `elevation_ft` with altimeter setting `qnh_hpa`, `oat_c`
    /// and an optional dew point (°C).
    pub fn from_observation(
        elevation_ft: f64,
        qnh_hpa: f64,
        oat_c: f64,
        dewpoint_c: Option<f64>,
    ) -> AirData {
        let pressure_altitude_ft = field_pressure_altitude_ft(elevation_ft, qnh_hpa);
        let station_pressure_hpa = pressure_at_pressure_altitude_hpa(pressure_altitude_ft);
        Self::at_station_pressure(
            elevation_ft,
            qnh_hpa,
            station_pressure_hpa,
            pressure_altitude_ft,
            oat_c,
            dewpoint_c,
        )
    }

    /// The same air with another temperature, station pressure held and the dew point
    /// capped at the new temperature (for warming scenarios and headroom searches).
    pub fn with_oat(&self, oat_c: f64) -> AirData {
        let dewpoint_c = self.dewpoint_c.map(|td| td.min(oat_c));
        Self::at_station_pressure(
            self.elevation_ft,
            self.qnh_hpa,
            self.station_pressure_hpa,
            self.pressure_altitude_ft,
            oat_c,
            dewpoint_c,
        )
    }

    fn at_station_pressure(
        elevation_ft: f64,
        qnh_hpa: f64,
        station_pressure_hpa: f64,
        pressure_altitude_ft: f64,
        oat_c: f64,
        dewpoint_c: Option<f64>,
    ) -> AirData {
        let isa_temperature_c = isa_temperature_c(pressure_altitude_ft);
        let density_dry_kg_m3 = density_kg_m3(station_pressure_hpa, oat_c, None);
        let density = match dewpoint_c {
            Some(_) => density_kg_m3(station_pressure_hpa, oat_c, dewpoint_c),
            None => density_dry_kg_m3,
        };
        AirData {
            elevation_ft,
            qnh_hpa,
            oat_c,
            dewpoint_c,
            station_pressure_hpa,
            pressure_altitude_ft,
            isa_temperature_c,
            isa_deviation_c: oat_c - isa_temperature_c,
            density_kg_m3: density,
            density_dry_kg_m3,
            density_ratio: density / SEA_LEVEL_DENSITY_KG_M3,
            density_altitude_ft: density_altitude_ft(density),
            density_altitude_dry_ft: density_altitude_ft(density_dry_kg_m3),
            density_altitude_rule_of_thumb_ft: density_altitude_rule_of_thumb_ft(
                pressure_altitude_ft,
                oat_c,
            ),
            true_airspeed_factor: true_airspeed_factor(density),
        }
    }
}

/// The figures of [`AirData::with_oat`] that performance needs, for many temperatures
/// at one observation's station pressure: a headroom search asks for a dozen. The vapour
/// pressure at the dew point is found once (it stays while the dew point is below the
/// OAT); the dry-air and rule-of-thumb density altitudes are not computed. Every value is
/// the one `with_oat` gives, bit for bit (the same operations in the same order).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Warming {
    station_pressure_hpa: f64,
    dewpoint_c: Option<f64>,
    /// Saturation vapour pressure at the dew point, hPa (NaN without one).
    vapour_at_dewpoint_hpa: f64,
}

/// The air of a [`Warming`] at one temperature.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WarmAir {
    /// Outside air temperature, °C.
    pub oat_c: f64,
    /// Air density (with humidity when a dew point is given), kg/m³.
    pub density_kg_m3: f64,
    /// Density altitude, ft.
    pub density_altitude_ft: f64,
    /// 1/√σ.
    pub true_airspeed_factor: f64,
}

impl Warming {
    /// The warming of `air`: its station pressure held, its dew point capped at the OAT.
    pub fn new(air: &AirData) -> Warming {
        Warming {
            station_pressure_hpa: air.station_pressure_hpa,
            dewpoint_c: air.dewpoint_c,
            vapour_at_dewpoint_hpa: air
                .dewpoint_c
                .map_or(f64::NAN, saturation_vapour_pressure_hpa),
        }
    }

    /// The air at `oat_c`.
    #[inline]
    pub fn at(&self, oat_c: f64) -> WarmAir {
        let p = self.station_pressure_hpa;
        let density = match self.dewpoint_c {
            Some(td) => {
                let capped = td.min(oat_c);
                let e_hpa = if capped == td {
                    self.vapour_at_dewpoint_hpa
                } else {
                    saturation_vapour_pressure_hpa(capped)
                };
                p * 100.0 / (R_DRY_J_KG_K * virtual_temperature_from_vapour_k(p, oat_c, e_hpa))
            }
            None => density_kg_m3(p, oat_c, None),
        };
        WarmAir {
            oat_c,
            density_kg_m3: density,
            density_altitude_ft: density_altitude_ft(density),
            true_airspeed_factor: true_airspeed_factor(density),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn layer_base_pressures_follow_from_the_layer_formulas() {
        for pair in LAYERS.windows(2) {
            let top = pair[0].pressure_pa(pair[1].base_m);
            assert!((top - pair[1].base_pressure_pa).abs() < 1e-6, "{top}");
            let t = pair[0].temperature_k(pair[1].base_m);
            assert!((t - pair[1].base_temperature_k).abs() < 1e-9);
        }
        assert!((SEA_LEVEL_DENSITY_KG_M3 - 1.225).abs() < 1e-6);
    }

    proptest! {
        /// The lean warming path gives exactly what `AirData::with_oat` gives, for dry
        /// and moist air, warming and cooling (also below the dew point, where the dew
        /// point is capped).
        #[test]
        fn warming_equals_with_oat(
            elevation_ft in -1_000.0f64..14_000.0, qnh_hpa in 950.0f64..1_060.0,
            oat_c in -30.0f64..45.0, spread_c in 0.0f64..30.0, moist in proptest::bool::ANY,
            dt_c in -40.0f64..40.0,
        ) {
            let air = AirData::from_observation(elevation_ft, qnh_hpa, oat_c, moist.then_some(oat_c - spread_c));
            let want = air.with_oat(oat_c + dt_c);
            let got = Warming::new(&air).at(oat_c + dt_c);
            prop_assert_eq!(got.oat_c.to_bits(), want.oat_c.to_bits());
            prop_assert_eq!(got.density_kg_m3.to_bits(), want.density_kg_m3.to_bits());
            prop_assert_eq!(got.density_altitude_ft.to_bits(), want.density_altitude_ft.to_bits());
            prop_assert_eq!(got.true_airspeed_factor.to_bits(), want.true_airspeed_factor.to_bits());
        }
    }

    proptest! {
        #[test]
        fn pressure_altitude_round_trips(pa_ft in -5_000.0f64..100_000.0) {
            let back = pressure_altitude_ft(pressure_at_pressure_altitude_hpa(pa_ft));
            prop_assert!((back - pa_ft).abs() < 1e-6, "{pa_ft} -> {back}");
        }

        #[test]
        fn density_altitude_round_trips(h_ft in -5_000.0f64..100_000.0) {
            let back = density_altitude_ft(isa_density_at_ft(h_ft));
            prop_assert!((back - h_ft).abs() < 1e-6, "{h_ft} -> {back}");
        }

        #[test]
        fn geometric_and_geopotential_round_trip(z_m in -5_000.0f64..50_000.0) {
            let back = geometric_from_geopotential_m(geopotential_from_geometric_m(z_m));
            prop_assert!((back - z_m).abs() < 1e-7);
        }

        #[test]
        fn qnh_reads_field_elevation(elev_ft in -1_500.0f64..20_000.0, qnh in 850.0f64..1_100.0) {
            // Setting the station pressure back into an altimeter set to QNH reads elevation.
            let p = station_pressure_hpa(elev_ft, qnh);
            let indicated = pressure_altitude_ft(p) - pressure_altitude_ft(qnh);
            prop_assert!((indicated - elev_ft).abs() < 1e-6);
        }

        #[test]
        fn warmer_or_moister_air_is_never_denser(
            elev_ft in -1_500.0f64..20_000.0,
            qnh in 850.0f64..1_100.0,
            t in -60.0f64..59.0,
            dt in 0.0f64..1.0,
            spread in 0.0f64..40.0,
        ) {
            let td = t - spread;
            let cool = AirData::from_observation(elev_ft, qnh, t, Some(td));
            let warm = cool.with_oat(t + dt);
            prop_assert!(warm.density_altitude_ft >= cool.density_altitude_ft - 1e-9);
            let dry = AirData::from_observation(elev_ft, qnh, t, None);
            prop_assert!(cool.density_altitude_ft >= dry.density_altitude_ft);
            prop_assert!((cool.density_altitude_dry_ft - dry.density_altitude_ft).abs() < 1e-9);
        }
    }
}
