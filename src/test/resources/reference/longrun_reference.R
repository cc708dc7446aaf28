# Reference values for org.orthogon.longrun, computed with the R package sandwich
# (Debian package r-cran-sandwich). CI has no R: the Java tests read the CSV files this script
# writes next to itself. Regenerate from the repository root with
#   Rscript src/test/resources/reference/longrun_reference.R
# Every value is written with 17 significant digits so that it parses back to the same double.
suppressPackageStartupMessages(library(sandwich))

args <- commandArgs(trailingOnly = FALSE)
script <- sub("^--file=", "", args[grep("^--file=", args)])
out_dir <- if (length(script) == 1) dirname(normalizePath(script)) else "."

fmt <- function(v) sprintf("%.17g", v)

# ---- the series: deterministic (no random numbers), T = 120, K = 3 -------------------------
# Non-zero means (so centering matters), slow sine components (so there is serial correlation for
# the kernels and bandwidth rules to act on) and a sin(t^2) term that looks irregular.
n <- 120L
t <- seq_len(n)
x <- cbind(
  f1 = 0.5 + sin(0.9 * t) + 0.6 * sin(0.21 * t),
  f2 = cos(1.7 * t + 0.3) + 0.4 * sin(0.21 * t + 1) + 0.2 * sin(t^2 / 7),
  f3 = -0.1 + sin(t^2 / 7) + 0.5 * cos(0.35 * t))
# The Java test reads the series back from this file, so both sides use bit-identical inputs.
write.csv(data.frame(t = t, f1 = fmt(x[, 1]), f2 = fmt(x[, 2]), f3 = fmt(x[, 3])),
          file.path(out_dir, "longrun_series.csv"), row.names = FALSE, quote = FALSE)
x <- as.matrix(read.csv(file.path(out_dir, "longrun_series.csv"))[, -1])

# ---- feeding moment contributions to sandwich ----------------------------------------------
# sandwich's HAC functions take a fitted model and call estfun() on it. A tiny class whose
# estfun() returns the moment matrix itself lets us hand over u_t (centered) or f_t (uncentered)
# unchanged. meatHAC(..., adjust = FALSE) returns
#   (1/n) [sum_t u_t u_t' + sum_{j>=1} w_j sum_t (u_t u_{t-j}' + u_{t-j} u_t')]
# which is Gamma_0 + sum_j k(j/b)(Gamma_j + Gamma_j') with Gamma_j divided by n: the convention of
# Orthogon (docs/methods.md, after Andrews 1991). After prewhitening it still divides by the original n (n.orig).
estfun.orthogonMoments <- function(x, ...) x$u
.S3method("estfun", "orthogonMoments", estfun.orthogonMoments)
moments <- function(u) structure(list(u = u), class = "orthogonMoments")

centered_u <- sweep(x, 2, colMeans(x))
mom <- list(centered = moments(centered_u), uncentered = moments(x))

kernels <- c(truncated = "Truncated", bartlett = "Bartlett", parzen = "Parzen",
             "tukey-hanning" = "Tukey-Hanning", "quadratic-spectral" = "Quadratic Spectral")

# Bandwidth rules: sandwich gives a column named "(Intercept)" weight 0 by default (it is the
# score of a regression intercept). Moment columns play no such role and Orthogon gives every column
# an equal weight, so weights = 1 for every column is passed explicitly.
w_equal <- rep(1, ncol(x))

# sandwich's weightsAndrews() drops trailing weights below tol = 1e-7. Orthogon's S keeps every
# lag with a non-zero k(j/b) (a Parzen weight of 4e-8 on the last lag still counts), so the
# references pass the complete weight vector k(j/b), j = 0..n-1, from sandwich's own kweights().
full_weights <- function(obj, bw, kernel, prewhite) {
  nn <- NROW(estfun(obj)) - as.integer(prewhite)
  w <- kweights(0:(nn - 1) / bw, kernel = kernel)
  trimmed <- weightsAndrews(obj, bw = bw, kernel = kernel, prewhite = prewhite)
  stopifnot(isTRUE(all.equal(w[seq_along(trimmed)], trimmed, tolerance = 1e-14)),
            all(abs(w[-seq_along(trimmed)]) <= 1e-7))
  w
}

# ---- an independent direct computation, to confirm the convention --------------------------
k_direct <- function(z, id) {
  a <- abs(z)
  switch(id,
    truncated = ifelse(a <= 1, 1, 0),
    bartlett = ifelse(a <= 1, 1 - a, 0),
    parzen = ifelse(a <= 0.5, 1 - 6 * a^2 + 6 * a^3, ifelse(a <= 1, 2 * (1 - a)^3, 0)),
    "tukey-hanning" = ifelse(a <= 1, (1 + cos(pi * a)) / 2, 0),
    "quadratic-spectral" = {
      y <- 6 * pi * z / 5
      25 / (12 * pi^2 * z^2) * (sin(y) / y - cos(y))
    })
}
direct_S <- function(u, id, b) {
  nn <- nrow(u)
  S <- crossprod(u) / nn
  if (id == "none") return(S)
  for (j in 1:(nn - 1)) {
    w <- k_direct(j / b, id)
    if (w != 0) {
      G <- crossprod(u[(j + 1):nn, , drop = FALSE], u[1:(nn - j), , drop = FALSE]) / nn
      S <- S + w * (G + t(G))
    }
  }
  S
}

# ---- collect the cases ---------------------------------------------------------------------
rows <- list()
add_case <- function(name, kernel_id, rule, bw, centered, prewhite, S) {
  for (i in seq_len(nrow(S))) for (j in seq_len(ncol(S)))
    rows[[length(rows) + 1L]] <<- data.frame(
      case = name, kernel = kernel_id, rule = rule, bandwidth = fmt(bw),
      centered = centered, prewhite = prewhite, row = i - 1L, col = j - 1L, value = fmt(S[i, j]))
}
check <- function(a, b, what) {
  ok <- isTRUE(all.equal(unname(a), unname(b), tolerance = 1e-12))
  if (!ok) stop("direct computation disagrees with sandwich: ", what)
}

# HC (kernel "none"): a single weight 1 keeps Gamma_0 only.
for (cen in names(mom)) {
  S <- meatHAC(mom[[cen]], weights = 1, prewhite = FALSE, adjust = FALSE)
  check(S, crossprod(mom[[cen]]$u) / n, paste("hc", cen))
  add_case(paste0("hc-", cen), "none", "fixed", 0, cen == "centered", FALSE, S)
}

# Every kernel at fixed bandwidths, centered and uncentered. b = 5 is Bartlett lag 4; b = 3.7
# exercises a real-valued bandwidth.
for (bw in c(5, 3.7)) for (id in names(kernels)) for (cen in names(mom)) {
  wts <- full_weights(mom[[cen]], bw, kernels[[id]], 0)
  S <- meatHAC(mom[[cen]], weights = wts, prewhite = FALSE, adjust = FALSE)
  check(S, direct_S(mom[[cen]]$u, id, bw), paste(id, bw, cen))
  if (cen == "centered") {
    # lrvar() on lm(x ~ 1) works on the centered series; times n it is the same S.
    lr <- lrvar(x, type = "Andrews", kernel = kernels[[id]], bw = bw, prewhite = FALSE,
                adjust = FALSE) * n
    check(S, lr, paste("lrvar", id, bw))
  }
  add_case(sprintf("%s-bw%s-%s", id, bw, cen), id, "fixed", bw, cen == "centered", FALSE, S)
}

# Automatic bandwidths and the S they give, with and without VAR(1) prewhitening.
bws <- list()
add_bw <- function(rule, id, cen, pw, b)
  bws[[length(bws) + 1L]] <<- data.frame(rule = rule, kernel = id, centered = cen == "centered",
                                         prewhite = pw, bandwidth = fmt(b))
for (pw in c(0L, 1L)) for (cen in names(mom)) {
  for (id in names(kernels)) {
    b <- bwAndrews(mom[[cen]], kernel = kernels[[id]], weights = w_equal, prewhite = pw)
    add_bw("andrews", id, cen, pw == 1L, b)
    wts <- full_weights(mom[[cen]], b, kernels[[id]], pw)
    S <- meatHAC(mom[[cen]], weights = wts, prewhite = pw, adjust = FALSE)
    add_case(sprintf("%s-andrews-pw%d-%s", id, pw, cen), id, "andrews", b, cen == "centered",
             pw == 1L, S)
  }
  for (id in c("bartlett", "parzen", "quadratic-spectral")) {
    b <- bwNeweyWest(mom[[cen]], kernel = kernels[[id]], weights = w_equal, prewhite = pw)
    add_bw("newey-west", id, cen, pw == 1L, b)
    wts <- full_weights(mom[[cen]], b, kernels[[id]], pw)
    S <- meatHAC(mom[[cen]], weights = wts, prewhite = pw, adjust = FALSE)
    add_case(sprintf("%s-newey-west-pw%d-%s", id, pw, cen), id, "newey-west", b,
             cen == "centered", pw == 1L, S)
  }
}
# Prewhitened at a fixed bandwidth too, so prewhitening is checked apart from bandwidth choice.
for (id in c("bartlett", "quadratic-spectral")) for (cen in names(mom)) {
  wts <- full_weights(mom[[cen]], 5, kernels[[id]], 1)
  S <- meatHAC(mom[[cen]], weights = wts, prewhite = 1, adjust = FALSE)
  add_case(sprintf("%s-bw5-pw1-%s", id, cen), id, "fixed", 5, cen == "centered", TRUE, S)
}
# sandwich's default HAC choice (QS, Andrews bandwidth, VAR(1) prewhitening) on the centered series,
# cross-checked through lrvar() so the whole chain is confirmed by a second entry point.
S_pw <- meatHAC(mom$centered, weights = weightsAndrews(mom$centered, bw = bwAndrews,
                kernel = "Quadratic Spectral", prewhite = 1, weights = w_equal),
                prewhite = 1, adjust = FALSE)
lr_pw <- lrvar(x, type = "Andrews", prewhite = TRUE, adjust = FALSE) * n
cat("lrvar default (sandwich's own column weights) vs equal weights, max abs diff:",
    max(abs(S_pw - lr_pw)), "\n")

write.csv(do.call(rbind, rows), file.path(out_dir, "longrun_reference.csv"),
          row.names = FALSE, quote = FALSE)
write.csv(do.call(rbind, bws), file.path(out_dir, "longrun_bandwidths.csv"),
          row.names = FALSE, quote = FALSE)
cat(sprintf("sandwich %s, R %s: wrote %d matrix cases and %d bandwidths to %s\n",
            packageVersion("sandwich"), getRversion(), length(rows) / 9, length(bws), out_dir))
