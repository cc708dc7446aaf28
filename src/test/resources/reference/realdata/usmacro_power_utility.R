# Independent reference for org.orthogon.cli.RealDataCheckTest: a two-step GMM fit of power utility
# on US quarterly macro data, written from the formulas in docs/methods.md (Hansen 1982; Newey-West 1987)
# without any of Orthogon's code and without any GMM package (base R only: optim, nlminb, solve).
#
# Source: the data set USMacroG of the R package AER 1.2-10 (US quarterly macroeconomic series
# 1950Q1-2000Q4 from the US Department of Commerce and the Federal Reserve, as published with Greene,
# "Econometric Analysis"), as shipped by the Debian package r-cran-aer, version 1.2-10-1.
#
# Series written beside this script (Orthogon's wide CSV, dates YYYYQn, decimals):
#   usmacro-consumption.csv  cons_growth_t = (consumption_t / population_t) /
#       (consumption_{t-1} / population_{t-1}), consumption being real consumption expenditures,
#       gross growth of real per-capita consumption over quarter t, on the row of quarter t.
#   usmacro-tbill.csv  tbill_t = (1 + tbill_{t-1} / 400) * cpi_{t-1} / cpi_t, the gross real
#       return of holding the 3-month bill through quarter t. The nominal rate is the one quoted
#       before the quarter starts: the data set carries only quarter averages, so the previous
#       quarter's average stands in for the rate at the start of quarter t, which keeps the nominal
#       payoff known in advance. The annual percent rate is divided by 400 (simple quarterly rate);
#       cpi is end-of-quarter, so cpi_{t-1} / cpi_t deflates exactly over quarter t.
#   usmacro-instruments.csv  z_growth_t = cons_growth_t, z_tbill_t = tbill_t on the row of quarter
#       t. Orthogon itself pairs instrument row t with the moment of t+1, so these are the lagged
#       instruments of the Euler equation; "const" is Orthogon's built-in column of ones.
#
# Moments (K = 3, P = 2): f_t = (beta g_t^-gamma R_t - 1) (1, g_{t-1}, R_{t-1})', t = 1950Q3..2000Q4.
# Two-step GMM: W1 = I; S = centered long-run covariance at theta1, either Gamma_0 (kernel "none") or
# Bartlett with L = 4 lags, S = Gamma_0 + sum_j (1 - j/(L+1)) (Gamma_j + Gamma_j'), Gamma_j =
# (1/T) sum_t u_t u_{t-j}'; W2 = S(theta1)^-1; J = T g' W2 g at theta2; covariance
# (D' S(theta2)^-1 D)^-1 / T with S re-evaluated at theta2.
#
# Run (after apt-get install r-cran-aer): Rscript usmacro_power_utility.R
# Writes the three data files and usmacro_power_utility_values.csv (17 significant digits).

here <- tryCatch(dirname(normalizePath(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE)))),
                 error = function(e) ".")

data("USMacroG", package = "AER")
raw <- as.data.frame(USMacroG)
n <- nrow(raw)
stopifnot(n == 204, all(tsp(USMacroG) == c(1950, 2000.75, 4)))
label <- sprintf("%04dQ%d", 1950 + (seq_len(n) - 1) %/% 4, (seq_len(n) - 1) %% 4 + 1)

percap <- raw$consumption / raw$population
growth <- percap[-1] / percap[-n]
tbill <- (1 + raw$tbill[-n] / 400) * raw$cpi[-n] / raw$cpi[-1]
dates <- label[-1]                     # 1950Q2 .. 2000Q4, 203 quarters

# 17 significant digits so that the files carry the doubles the script itself computes with.
fmt <- function(x) sprintf("%.17g", x)
write_wide <- function(name, columns) {
  body <- do.call(paste, c(list(dates), lapply(columns, fmt), sep = ","))
  writeLines(c(paste(c("date", names(columns)), collapse = ","), body), file.path(here, name))
}
write_wide("usmacro-consumption.csv", list(cons_growth = growth))
write_wide("usmacro-tbill.csv", list(tbill = tbill))
write_wide("usmacro-instruments.csv", list(z_growth = growth, z_tbill = tbill))

# Read back what was written, so the fit uses exactly the numbers Orthogon will read.
g_all <- as.numeric(read.csv(file.path(here, "usmacro-consumption.csv"))$cons_growth)
r_all <- as.numeric(read.csv(file.path(here, "usmacro-tbill.csv"))$tbill)
inst <- read.csv(file.path(here, "usmacro-instruments.csv"))
m <- length(g_all)
g <- g_all[-1]
R <- r_all[-1]
Z <- cbind(1, inst$z_growth[-m], inst$z_tbill[-m])   # z_{t-1} beside f_t
Tn <- length(g)
K <- ncol(Z)

moments <- function(th) {
  e <- th[1] * g^(-th[2]) * R - 1
  Z * e                                   # T x K, rows f_t'
}
gbar <- function(th) colMeans(moments(th))
jac <- function(th) {                     # D = d gbar / d theta', K x 2
  a <- g^(-th[2]) * R
  cbind(colMeans(Z * a), colMeans(Z * (-th[1] * log(g) * a)))
}
second <- function(th) {                  # d2 gbar_k / d theta d theta', as three K-vectors
  a <- g^(-th[2]) * R
  lg <- log(g)
  list(bb = rep(0, K), bg = colMeans(Z * (-lg * a)), gg = colMeans(Z * (th[1] * lg^2 * a)))
}
longrun <- function(th, lags) {
  u <- sweep(moments(th), 2, colMeans(moments(th)))
  S <- crossprod(u) / Tn
  if (lags > 0) for (j in 1:lags) {
    G <- crossprod(u[(j + 1):Tn, , drop = FALSE], u[1:(Tn - j), , drop = FALSE]) / Tn
    S <- S + (1 - j / (lags + 1)) * (G + t(G))
  }
  S
}
objective <- function(th, W) { v <- gbar(th); Tn * drop(t(v) %*% W %*% v) }
gradient <- function(th, W) 2 * Tn * drop(t(jac(th)) %*% W %*% gbar(th))
hessian <- function(th, W) {
  D <- jac(th); h <- second(th); wg <- drop(W %*% gbar(th))
  H <- t(D) %*% W %*% D
  H[1, 1] <- H[1, 1] + sum(wg * h$bb)
  H[1, 2] <- H[1, 2] + sum(wg * h$bg)
  H[2, 1] <- H[1, 2]
  H[2, 2] <- H[2, 2] + sum(wg * h$gg)
  2 * Tn * H
}

# Several starts, a quasi-Newton pass, then Newton steps with the analytic Hessian and a backtracking
# line search. The first-step objective is of order 1e-7 and nearly flat along beta E[g^-gamma R] = 1,
# where nlminb alone stops early; the reference must be converged well past the 1e-6 the test asks for,
# so the Newton step |H^-1 grad| (the distance to the minimum) is printed and must be negligible.
gnorm <- function(th, W) max(abs(gradient(th, W)))
newton <- function(th, W) {
  for (i in 1:200) {
    step <- tryCatch(solve(hessian(th, W), gradient(th, W)), error = function(e) NULL)
    if (is.null(step) || sum(step * gradient(th, W)) <= 0) step <- gradient(th, W) * 1e-6
    q0 <- objective(th, W)
    t <- 1
    repeat {
      nxt <- th - t * step
      q1 <- objective(nxt, W)
      # Near the minimum Q is flat to rounding, so a step that leaves Q equal to rounding is taken
      # when it shrinks the (accurately computed) gradient.
      if (is.finite(q1) && (q1 < q0 || (q1 <= q0 * (1 + 1e-12) && gnorm(nxt, W) < gnorm(th, W)))) break
      t <- t / 2
      if (t < 1e-12) return(th)
    }
    th <- nxt
  }
  th
}
minimise <- function(W) {
  starts <- list(c(0.99, 2), c(0.99, 0.5), c(1, 5), c(0.95, 10), c(1.01, -1), c(0.9, 20), c(1, 0))
  found <- list()
  for (s in starts) {
    fit <- tryCatch(nlminb(s, objective, gradient, hessian, W = W,
                           control = list(eval.max = 2000, iter.max = 1000)),
                    error = function(e) NULL)
    th <- if (is.null(fit) || !is.finite(fit$objective)) s else fit$par
    th <- newton(th, W)
    q <- objective(th, W)
    newton_step <- max(abs(solve(hessian(th, W), gradient(th, W))))
    cat(sprintf("  start (%g, %g): beta %.15g gamma %.15g Q %.15g |grad| %.3g |newton step| %.3g\n",
                s[1], s[2], th[1], th[2], q, gnorm(th, W), newton_step))
    found[[length(found) + 1]] <- list(th = th, q = q, step = newton_step)
  }
  # Among the starts that reach the lowest Q (to rounding), the one nearest a zero gradient wins.
  qmin <- min(sapply(found, `[[`, "q"))
  level <- Filter(function(f) f$q <= qmin * (1 + 1e-10), found)
  level[[which.min(sapply(level, `[[`, "step"))]]$th
}

# A second route to the same minimum: beta enters g linearly, so for each gamma the best beta is
# a'Wb / a'Wa with a = mean(z g^-gamma R), b = mean(z); a one-dimensional search in gamma remains.
profiled <- function(W, around) {
  beta_at <- function(gam) { a <- colMeans(Z * g^(-gam) * R); b <- colMeans(Z); sum(a * (W %*% b)) / sum(a * (W %*% a)) }
  # With beta at its best, dQ/dgamma is the partial derivative alone (envelope), so its root is sought.
  gam <- uniroot(function(x) gradient(c(beta_at(x), x), W)[2], around + c(-1, 1), tol = 1e-15)$root
  c(beta_at(gam), gam)
}

cat("T =", Tn, " K =", K, "\n")
cat("first step, W = I\n")
theta1 <- minimise(diag(K))
check <- profiled(diag(K), theta1[2])
cat(sprintf("  profiled search: beta %.15g gamma %.15g\n", check[1], check[2]))
stopifnot(max(abs(check - theta1) / abs(theta1)) < 1e-7)
rows <- list()
for (lags in c(0, 4)) {
  kernel <- if (lags == 0) "none" else "bartlett"
  cat("second step, kernel", kernel, "lags", lags, "\n")
  W2 <- solve(longrun(theta1, lags))
  theta2 <- minimise(W2)
  check <- profiled(W2, theta2[2])
  cat(sprintf("  profiled search: beta %.15g gamma %.15g\n", check[1], check[2]))
  stopifnot(max(abs(check - theta2) / abs(theta2)) < 1e-7)
  J <- objective(theta2, W2)
  D <- jac(theta2)
  V <- solve(t(D) %*% solve(longrun(theta2, lags)) %*% D) / Tn
  rows[[kernel]] <- data.frame(kernel = kernel, lags = lags, observations = Tn,
                               beta = fmt(theta2[1]), gamma = fmt(theta2[2]),
                               se_beta = fmt(sqrt(V[1, 1])), se_gamma = fmt(sqrt(V[2, 2])),
                               j_stat = fmt(J), j_df = K - 2,
                               beta_step1 = fmt(theta1[1]), gamma_step1 = fmt(theta1[2]),
                               grad_max = sprintf("%.3g", max(abs(gradient(theta2, W2)))),
                               newton_step = sprintf("%.3g", max(abs(solve(hessian(theta2, W2), gradient(theta2, W2))))))
}
out <- do.call(rbind, rows)
write.csv(out, file.path(here, "usmacro_power_utility_values.csv"), row.names = FALSE, quote = FALSE)
print(out, right = FALSE)
