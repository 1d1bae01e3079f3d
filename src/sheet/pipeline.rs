//! Streaming: one thread reads chunks of records, rayon solves each chunk
//! on every core, one thread writes the results in input order. At most a
//! few chunks are alive at once, so memory does not grow with the rows.

use super::lines::Lines;
use super::plan::Plan;
use super::row::{evaluate, Scratch};
use super::summary::{Summary, Tally};
use super::write::{RowWriter, Style};
use super::SheetError;
use indicatif::ProgressBar;
use rayon::prelude::*;
use std::io::{Read, Write};
use std::sync::mpsc::{channel, sync_channel, Receiver, Sender, SyncSender};

/// Rows per chunk read ahead.
const CHUNK: usize = 8192;
/// Bytes of fields per chunk at most (a sheet of wide rows makes shorter
/// chunks), so that memory is bounded whatever the width of the rows.
const CHUNK_BYTES: usize = 4 * 1024 * 1024;
/// Rows per parallel task.
const TASK: usize = 512;
/// Chunks waiting between the stages.
const DEPTH: usize = 2;

/// A chunk of records with the line each starts on.
struct Chunk {
    records: Vec<csv::ByteRecord>,
    lines: Vec<u64>,
    len: usize,
    /// Bytes read when the chunk was complete.
    bytes: u64,
}

impl Chunk {
    /// An empty chunk; its records are made as they are first needed, so a
    /// small sheet allocates little.
    fn new() -> Self {
        Chunk {
            records: Vec::new(),
            lines: Vec::new(),
            len: 0,
            bytes: 0,
        }
    }
}

fn read_chunks<R: Read>(
    mut reader: csv::Reader<Lines<R>>,
    full: SyncSender<Result<Chunk, SheetError>>,
    empty: Receiver<Chunk>,
) {
    loop {
        let mut chunk = empty.try_recv().unwrap_or_else(|_| Chunk::new());
        chunk.len = 0;
        let mut done = false;
        let mut bytes = 0;
        while chunk.len < CHUNK && bytes < CHUNK_BYTES {
            let i = chunk.len;
            if i == chunk.records.len() {
                chunk.records.push(csv::ByteRecord::new());
                chunk.lines.push(0);
            }
            match reader.read_byte_record(&mut chunk.records[i]) {
                Ok(true) => {
                    let at = chunk.records[i].position().map_or(0, |p| p.byte());
                    chunk.lines[i] = reader.get_mut().record_line(at);
                    bytes += chunk.records[i].as_slice().len();
                    chunk.len += 1;
                }
                Ok(false) => {
                    done = true;
                    break;
                }
                Err(e) => {
                    let at = reader.position().byte();
                    let line = reader.get_mut().line_at(at);
                    let source = match e.into_kind() {
                        csv::ErrorKind::Io(io) => io,
                        other => std::io::Error::other(format!("{other:?}")),
                    };
                    let _ = full.send(Err(SheetError::ReadFailed { line, source }));
                    return;
                }
            }
        }
        chunk.bytes = reader.position().byte();
        if chunk.len > 0 && full.send(Ok(chunk)).is_err() {
            return;
        }
        if done {
            return;
        }
    }
}

fn write_pieces<W: Write>(out: W, pieces: Receiver<Vec<Vec<u8>>>) -> Result<W, std::io::Error> {
    let mut out = std::io::BufWriter::with_capacity(8 * 1024, out);
    for batch in pieces {
        for piece in batch {
            out.write_all(&piece)?;
        }
    }
    out.flush()?;
    out.into_inner().map_err(|e| e.into_error())
}

/// Solves one task's rows and writes them.
fn task(
    plan: &Plan,
    style: Style,
    keys: &[Vec<u8>],
    records: &[csv::ByteRecord],
    lines: &[u64],
) -> (Vec<u8>, Tally) {
    let mut scratch = Scratch::default();
    let mut tally = Tally::default();
    let mut writer = RowWriter::new(style, keys, records.len() * 256);
    for (record, line) in records.iter().zip(lines) {
        evaluate(plan, record, *line, &mut scratch);
        writer.row(plan, record, &scratch);
        tally.add(&scratch, *line);
    }
    (writer.finish(), tally)
}

/// Runs the sheet: `header` (bytes) first, then every row. Returns the
/// sink when all is written.
pub(crate) fn run<R: Read + Send, W: Write + Send>(
    plan: &Plan,
    style: Style,
    keys: &[Vec<u8>],
    reader: csv::Reader<Lines<R>>,
    out: W,
    header: Vec<u8>,
    progress: Option<&ProgressBar>,
) -> Result<(Summary, W), SheetError> {
    let mut tally = Tally::default();
    std::thread::scope(|scope| {
        let (full_tx, full_rx) = sync_channel::<Result<Chunk, SheetError>>(DEPTH);
        let (empty_tx, empty_rx): (Sender<Chunk>, Receiver<Chunk>) = channel();
        let (out_tx, out_rx) = sync_channel::<Vec<Vec<u8>>>(DEPTH);
        scope.spawn(move || read_chunks(reader, full_tx, empty_rx));
        let writer = scope.spawn(move || write_pieces(out, out_rx));

        let mut failure: Option<SheetError> = None;
        let send = |batch: Vec<Vec<u8>>| out_tx.send(batch).is_ok();
        if send(vec![header]) {
            for message in &full_rx {
                let chunk = match message {
                    Ok(c) => c,
                    Err(e) => {
                        failure = Some(e);
                        break;
                    }
                };
                let n = chunk.len;
                let results: Vec<(Vec<u8>, Tally)> = chunk.records[..n]
                    .par_chunks(TASK)
                    .zip(chunk.lines[..n].par_chunks(TASK))
                    .map(|(records, lines)| task(plan, style, keys, records, lines))
                    .collect();
                let mut batch = Vec::with_capacity(results.len());
                for (bytes, t) in results {
                    tally.merge(t);
                    batch.push(bytes);
                }
                if let Some(p) = progress {
                    p.set_position(chunk.bytes);
                }
                let _ = empty_tx.send(chunk);
                if !send(batch) {
                    break;
                }
            }
        }
        drop(out_tx);
        // Unblock the reader if it waits to send.
        drop(full_rx);
        let written = writer
            .join()
            .unwrap_or_else(|_| Err(std::io::Error::other("the writing thread panicked")));
        match (failure, written) {
            (Some(e), _) => Err(e),
            (None, Err(e)) => Err(SheetError::WriteFailed(e)),
            (None, Ok(w)) => Ok((tally.summary(plan), w)),
        }
    })
}
