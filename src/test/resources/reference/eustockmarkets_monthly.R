# Regenerates eustockmarkets_monthly.csv, the real-market check of the return plausibility rules
# in org.orthogon.data.ReturnTransformsTest.
#
# Source: the EuStockMarkets data set of R's "datasets" package (Debian package r-base-core):
# daily closing prices of the DAX, SMI, CAC and FTSE indices, 1991-1998, on a time base of
# 260 business days a year. The data set carries fractional years, not calendar dates, so a row
# is assigned to the month floor(12 * time); the months are therefore approximate by a day or two
# at their edges. A month's price is its last close; the file holds net monthly price returns in
# decimal (no dividends). The first and last months are partial in the data and are left out.
#
# Run: Rscript eustockmarkets_monthly.R   (writes eustockmarkets_monthly.csv beside it)
x <- EuStockMarkets
tt <- as.numeric(time(x))
month <- floor(12 * tt + 1e-9)
ends <- tapply(seq_along(month), month, max)
ends <- ends[-c(1, length(ends))]
prices <- x[ends, , drop = FALSE]
returns <- prices[-1, , drop = FALSE] / prices[-nrow(prices), , drop = FALSE] - 1
m <- as.integer(names(ends))[-1]
label <- sprintf("%04d-%02d", m %/% 12, m %% 12 + 1)
out <- data.frame(date = label, signif(returns, 10), check.names = FALSE)
here <- tryCatch(dirname(normalizePath(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE)))),
                 error = function(e) ".")
write.csv(out, file.path(here, "eustockmarkets_monthly.csv"), row.names = FALSE, quote = FALSE)
cat("rows:", nrow(out), " from", label[1], "to", label[length(label)], "\n")
cat("median |r|:", apply(abs(returns), 2, median), "\n")
cat("max |r|:", apply(abs(returns), 2, max), "\n")
