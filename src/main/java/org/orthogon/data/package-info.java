/**
 * Reading, checking and aligning the data files of a run; no numerics beyond what the data need.
 *
 * <p>Files are wide CSV: a header row, then one row per period with a date in the first column and
 * one number per series. {@link org.orthogon.data.CsvSeries} reads them into immutable
 * {@link org.orthogon.data.SeriesTable}s on a {@link org.orthogon.data.Period} index whose
 * {@link org.orthogon.data.Frequency} is detected from the dates. Anything the reader cannot take at
 * face value (a missing cell, a gap in the dates, a percent sign) is refused with an
 * {@link org.orthogon.data.InputException} that names file, line, column and the fix, because a
 * quietly patched return file produces a confident but wrong test.
 *
 * <p>{@link org.orthogon.data.ReturnTransforms} converts units and kinds of returns and compounds
 * them to a coarser frequency; {@link org.orthogon.data.Alignment} puts tables from several files on
 * a common sample and says which file limited it. Frequency changes are explicit: nothing here
 * averages returns or aligns different frequencies silently.
 */
package org.orthogon.data;
