//! What `rhoboard` prints with no subcommand while the board is being built: what the
//! tool does, the caution, and a worked `calc` example computed live.

use std::io::Write;

use crate::commands::Outcome;
use crate::commands::calc::{self, Inputs};

/// The worked example's inputs: a warm afternoon at a high field (invented values).
pub const EXAMPLE: [&str; 4] = ["5900ft", "30.12inHg", "31C", "8C"];

/// Prints the overview.
pub fn run(out: &mut dyn Write) -> anyhow::Result<Outcome> {
    writeln!(
        out,
        "rhoboard {} — a dispatch board for flight schools and charter operators.\n\
         For every planned leg it works out density altitude, takeoff and landing distance\n\
         against the runway, climb and wind against the operator's own minimums.\n",
        env!("CARGO_PKG_VERSION")
    )?;
    writeln!(out, "{}\n", crate::CAUTION)?;
    let args = calc::Args {
        elevation: EXAMPLE[0].into(),
        altimeter: EXAMPLE[1].into(),
        temp: EXAMPLE[2].into(),
        dewpoint: Some(EXAMPLE[3].into()),
        ias: Some("65kt".into()),
        json: false,
        stray: Vec::new(),
    };
    writeln!(
        out,
        "Worked example — rhoboard calc --elevation {} --altimeter {} --temp {} --dewpoint {} --ias 65kt\n",
        EXAMPLE[0], EXAMPLE[1], EXAMPLE[2], EXAMPLE[3]
    )?;
    let result = calc::compute(&Inputs::from_args(&args)?);
    writeln!(
        out,
        "  pressure altitude {} ft, density altitude {} ft (ISA {:+.1} °C), 65 kt indicated is {:.0} kt true.\n  {}\n",
        calc::feet(result.pressure_altitude_ft),
        calc::feet(crate::units::up0(result.density_altitude_ft)),
        result.isa_deviation_c,
        result.true_airspeed_kt.unwrap_or(f64::NAN),
        calc::meaning(&result)
    )?;
    writeln!(
        out,
        "Commands (rhoboard help COMMAND for each):\n  \
         board      the dispatch board (what rhoboard opens on a terminal)\n  \
         check      every leg of the day against the operator's minimums (try: rhoboard check)\n  \
         calc       the air at a field from elevation, altimeter setting and temperature\n  \
         metar      decodes METAR reports\n  \
         taf        decodes TAF forecasts\n  \
         validate   checks an operator folder and lists every problem\n  \
         init       writes a new operator folder from the fictional demo\n  \
         runway     today's runway state (closures, reduced distances, surface)\n  \
         leg set    re-plans a leg and shows it re-assessed\n  \
         signoff    an instructor's sign-off, into the tamper-evident log\n  \
         log        verifies or lists the sign-off log\n  \
         report     the printable briefing sheet\n\n\
         Values carry their unit: 5900ft 1800m 30.12inHg 1019hPa 31C 88F 15kt."
    )?;
    Ok(Outcome::Success)
}
