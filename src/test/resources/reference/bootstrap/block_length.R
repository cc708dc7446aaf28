# Politis and White (2004) automatic block length, with the correction of Patton, Politis and White
# (2009), written from the published formulas; autocovariances by R's own stats::acf (demeaned, divided
# by n). Writes the seeded series and the circular-block lengths the Java test compares with.
# Run from the project root: Rscript src/test/resources/reference/bootstrap/block_length.R
flat_top <- function(s) ifelse(abs(s) < 0.5, 1, ifelse(abs(s) <= 1, 2 * (1 - abs(s)), 0))

circular_block_length <- function(x) {
  n <- length(x)
  kn <- max(5, ceiling(log10(n)))
  m_max <- ceiling(sqrt(n)) + kn
  cap <- ceiling(min(3 * sqrt(n), n / 3))
  lags <- min(m_max, n - 1)
  r <- as.vector(acf(x, lag.max = lags, type = "covariance", plot = FALSE, demean = TRUE)$acf)
  rho <- r[-1] / r[1]
  critical <- 2 * sqrt(log10(n) / n)
  insignificant <- abs(rho) < critical
  m_hat <- NA
  for (m in 1:(lags - kn + 1)) {
    if (all(insignificant[m:(m + kn - 1)])) { m_hat <- m; break }
  }
  if (is.na(m_hat)) {
    significant <- which(abs(rho) > critical)
    m_hat <- if (length(significant) == 0) 1 else max(significant)
  }
  big_m <- min(2 * m_hat, lags)
  k <- 1:big_m
  g <- sum(2 * flat_top(k / big_m) * k * r[k + 1])
  long_run <- r[1] + sum(2 * flat_top(k / big_m) * r[k + 1])
  d <- 4 / 3 * long_run^2
  min((2 * g^2 / d)^(1 / 3) * n^(1 / 3), cap)
}

set.seed(20040101)
n <- 300
series <- cbind(
  white = rnorm(n),
  ar05 = as.vector(arima.sim(list(ar = 0.5), n)),
  ar09 = as.vector(arima.sim(list(ar = 0.9), n)),
  ma2 = as.vector(arima.sim(list(ma = c(0.6, 0.3)), n)))
out <- "src/test/resources/reference/bootstrap"
write.csv(format(series, digits = 17), file.path(out, "block_length_series.csv"), row.names = FALSE, quote = FALSE)
lengths <- apply(series, 2, circular_block_length)
write.csv(data.frame(series = names(lengths), block_length = sprintf("%.17g", lengths)),
          file.path(out, "block_length_values.csv"), row.names = FALSE, quote = FALSE)
print(lengths)
