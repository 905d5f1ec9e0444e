//! The one path every printing command writes standard output through.
//!
//! A reader that stops early (`rhoboard check | head -1`) closes the pipe; the next
//! write fails with `EPIPE`. That is no error of the command's and must not change its
//! verdict: the exit status stays what the assessment says (README "Exit status"), and
//! nothing is written to standard error. [`PipeSafe`] turns the first broken-pipe
//! error into a quiet "closed" state and drops everything written after it, so a
//! command runs to its end and returns its [`Outcome`](crate::commands::Outcome)
//! whether or not its output was cut. Every other write error is passed on.

use std::io::{self, ErrorKind, Write};

/// A writer that treats a closed reader as the end of its output, not as a failure.
#[derive(Debug)]
pub struct PipeSafe<W: Write> {
    inner: W,
    closed: bool,
}

impl<W: Write> PipeSafe<W> {
    /// Wraps `inner` (in the binary, the locked standard output).
    pub const fn new(inner: W) -> Self {
        Self {
            inner,
            closed: false,
        }
    }

    /// Whether the reader went away: everything written since was dropped.
    pub const fn reader_closed(&self) -> bool {
        self.closed
    }

    /// Maps a broken pipe to "closed"; passes every other outcome on.
    fn absorb<T>(&mut self, r: io::Result<T>, closed_value: T) -> io::Result<T> {
        match r {
            Err(e) if e.kind() == ErrorKind::BrokenPipe => {
                self.closed = true;
                Ok(closed_value)
            }
            other => other,
        }
    }
}

impl<W: Write> Write for PipeSafe<W> {
    fn write(&mut self, buf: &[u8]) -> io::Result<usize> {
        if self.closed {
            return Ok(buf.len());
        }
        let r = self.inner.write(buf);
        self.absorb(r, buf.len())
    }

    fn flush(&mut self) -> io::Result<()> {
        if self.closed {
            return Ok(());
        }
        let r = self.inner.flush();
        self.absorb(r, ())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Takes `room` bytes, then fails every write and flush with `kind`.
    struct Closing {
        room: usize,
        got: Vec<u8>,
        kind: ErrorKind,
        calls_after: usize,
    }

    impl Write for Closing {
        fn write(&mut self, buf: &[u8]) -> io::Result<usize> {
            if self.room == 0 {
                self.calls_after += 1;
                return Err(io::Error::from(self.kind));
            }
            let n = buf.len().min(self.room);
            self.room -= n;
            self.got.extend_from_slice(&buf[..n]);
            Ok(n)
        }
        fn flush(&mut self) -> io::Result<()> {
            if self.room == 0 {
                return Err(io::Error::from(self.kind));
            }
            Ok(())
        }
    }

    #[test]
    fn a_broken_pipe_ends_the_output_quietly_and_later_writes_are_dropped() {
        let mut w = PipeSafe::new(Closing {
            room: 6,
            got: Vec::new(),
            kind: ErrorKind::BrokenPipe,
            calls_after: 0,
        });
        writeln!(w, "first line").expect("a closed reader is no error");
        writeln!(w, "second line").expect("dropped");
        w.flush().expect("flush after close");
        assert!(w.reader_closed());
        assert_eq!(w.inner.got, b"first ");
        // Only the write that met the closed pipe reached the inner writer.
        assert_eq!(w.inner.calls_after, 1);
    }

    #[test]
    fn other_write_errors_are_passed_on() {
        let mut w = PipeSafe::new(Closing {
            room: 0,
            got: Vec::new(),
            kind: ErrorKind::StorageFull,
            calls_after: 0,
        });
        let e = writeln!(w, "x").expect_err("a full disk is an error");
        assert_eq!(e.kind(), ErrorKind::StorageFull);
        assert!(!w.reader_closed());
    }
}
