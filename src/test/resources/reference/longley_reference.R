# Reference values for the GMM-equals-OLS check in org.orthogon.gmm, computed with R's lm() (base R)
# and the R package sandwich (Debian packages r-base-core and r-cran-sandwich) on R's longley
# dataset (package datasets). CI has no R: the Java tests read the CSV files this script writes next
# to itself. Regenerate from the repository root with
#   Rscript src/test/resources/reference/longley_reference.R
# Every value is written with 17 significant digits so that it parses back to the same double.
suppressPackageStartupMessages(library(sandwich))

args <- commandArgs(trailingOnly = FALSE)
script <- sub("^--file=", "", args[grep("^--file=", args)])
out_dir <- if (length(script) == 1) dirname(normalizePath(script)) else "."

fmt <- function(v) sprintf("%.17g", v)

data(longley, package = "datasets")
# The data as R ships them (Employed in millions, GNP in billions, ...). The Java test reads this
# file back, so both sides use bit-identical inputs.
write.csv(data.frame(Year = longley$Year, Employed = fmt(longley$Employed),
                     GNP.deflator = fmt(longley$GNP.deflator), GNP = fmt(longley$GNP),
                     Unemployed = fmt(longley$Unemployed), Armed.Forces = fmt(longley$Armed.Forces),
                     Population = fmt(longley$Population)),
          file.path(out_dir, "longley.csv"), row.names = FALSE, quote = FALSE)
d <- read.csv(file.path(out_dir, "longley.csv"))

fit <- lm(Employed ~ GNP.deflator + GNP + Unemployed + Armed.Forces + Population + Year, data = d)
b <- coef(fit)
# HC0: (X'X)^{-1} sum_t x_t x_t' e_t^2 (X'X)^{-1}, no small-sample factor.
v_hc0 <- vcovHC(fit, type = "HC0")
# Bartlett kernel with 4 lags, weights 1 - j/5 (Newey-West 1987), no prewhitening, no T/(T-K).
v_nw4 <- NeweyWest(fit, lag = 4, prewhite = FALSE, adjust = FALSE)

names_b <- c("const", "GNP.deflator", "GNP", "Unemployed", "Armed.Forces", "Population", "Year")
rows <- list()
for (i in seq_along(b)) {
  rows[[length(rows) + 1]] <- c("coefficient", names_b[i], "", fmt(b[i]))
}
for (i in seq_along(b)) for (j in seq_along(b)) {
  rows[[length(rows) + 1]] <- c("hc0", names_b[i], names_b[j], fmt(v_hc0[i, j]))
}
for (i in seq_along(b)) for (j in seq_along(b)) {
  rows[[length(rows) + 1]] <- c("bartlett4", names_b[i], names_b[j], fmt(v_nw4[i, j]))
}
out <- as.data.frame(do.call(rbind, rows), stringsAsFactors = FALSE)
names(out) <- c("quantity", "row", "column", "value")
write.csv(out, file.path(out_dir, "longley_reference.csv"), row.names = FALSE, quote = FALSE)
