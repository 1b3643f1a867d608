# The ARMA grid's series catalogue: open R datasets and seeded simulations. Sourced by
# r-arma-grid.R and r-diagnostics.R (needs common.R). build_series() returns a named list.
build_series <- function() {
  RNGkind("Mersenne-Twister", "Inversion", "Rejection")
  series <- list()
  add_dataset <- function(name, x, note) {
    series[[name]] <<- list(
      name = name, kind = "dataset", source = paste0("R datasets::", name, " (", note, ")"),
      data = I(as.numeric(x)), model = NULL, seed = NULL
    )
  }
  add_dataset("LakeHuron", LakeHuron, "annual level of Lake Huron 1875-1972, ft")
  add_dataset("lh", lh, "luteinizing hormone in blood samples at 10 min intervals")
  add_dataset("Nile", Nile, "annual flow of the Nile at Aswan 1871-1970")
  add_dataset("presidents", presidents, "quarterly approval ratings 1945-1974, contains NA")
  add_dataset("sunspot.year", sunspot.year, "yearly sunspot numbers 1700-1988")
  add_dataset("WWWusage", WWWusage, "internet users per minute on a server, used with d = 1")

  # Simulated series: generating model in the project's convention (ma-minus: theta).
  sims <- list(
    list(name = "sim-ar1-156", n = 156, ar = 0.6, theta = numeric(0), mean = 100, sd = 10, gaps = 0),
    list(name = "sim-ar2-208", n = 208, ar = c(0.5, 0.3), theta = numeric(0), mean = 50, sd = 5, gaps = 0),
    list(name = "sim-ma1-104", n = 104, ar = numeric(0), theta = 0.5, mean = 20, sd = 3, gaps = 0),
    list(name = "sim-ma2-182", n = 182, ar = numeric(0), theta = c(0.4, -0.3), mean = 80, sd = 8, gaps = 0),
    list(name = "sim-arma11-156", n = 156, ar = 0.7, theta = 0.4, mean = 120, sd = 12, gaps = 0),
    list(name = "sim-arma22-156", n = 156, ar = c(0.6, -0.3), theta = c(0.3, 0.2), mean = 60, sd = 6, gaps = 0),
    list(name = "sim-arma21-260", n = 260, ar = c(1.1, -0.4), theta = 0.5, mean = 200, sd = 15, gaps = 0),
    list(name = "sim-arma12-234", n = 234, ar = 0.5, theta = c(-0.4, -0.3), mean = 40, sd = 4, gaps = 0),
    list(name = "sim-ar1-nearunit-156", n = 156, ar = 0.95, theta = numeric(0), mean = 300, sd = 10, gaps = 0),
    list(name = "sim-ma1-nearinvert-130", n = 130, ar = numeric(0), theta = 0.9, mean = 30, sd = 3, gaps = 0),
    list(name = "sim-white-104", n = 104, ar = numeric(0), theta = numeric(0), mean = 15, sd = 2, gaps = 0),
    list(name = "sim-ar1-gaps-156", n = 156, ar = 0.5, theta = numeric(0), mean = 90, sd = 9, gaps = 3),
    list(name = "sim-arma11-gaps-208", n = 208, ar = 0.8, theta = 0.3, mean = 150, sd = 10, gaps = 4),
    list(name = "sim-ma1-gaps-130", n = 130, ar = numeric(0), theta = -0.5, mean = 25, sd = 3, gaps = 2),
    list(name = "sim-arma22-gaps-260", n = 260, ar = c(0.3, 0.4), theta = c(-0.2, 0.3), mean = 70, sd = 7, gaps = 5)
  )
  seed_base <- 20261201L
  for (i in seq_along(sims)) {
    s <- sims[[i]]
    seed <- seed_base + i
    set.seed(seed)
    y <- sim_arma(s$n, s$ar, s$theta, s$mean, s$sd)
    if (s$gaps > 0) y <- add_stockout_gaps(y, s$gaps)
    series[[s$name]] <- list(
      name = s$name, kind = "simulated",
      source = paste0(
        "arima.sim with set.seed(", seed, "), burn-in 200, plus mean, rounded to 3 decimals",
        if (s$gaps > 0) paste0("; ", s$gaps, " runs of 1-3 missing weeks (stocked out)") else ""
      ),
      data = I(y),
      model = list(ar = I(s$ar), ma = I(s$theta), mean = s$mean, sigma2 = s$sd^2),
      seed = seed
    )
  }
  # One integrated series for d = 1: cumulative sum of an ARMA(1,1) (ma-minus theta = 0.3).
  seed <- seed_base + 100L
  set.seed(seed)
  dx <- stats::arima.sim(model = list(ar = 0.5, ma = -0.3), n = 155, sd = 5, n.start = 200)
  series[["sim-arima111-156"]] <- list(
    name = "sim-arima111-156", kind = "simulated",
    source = paste0("500 + cumsum of arima.sim ARMA(1,1) with set.seed(", seed, "), burn-in 200, rounded to 3 decimals"),
    data = I(round(c(500, 500 + cumsum(as.numeric(dx))), 3)),
    model = list(d = 1, ar = I(0.5), ma = I(0.3), mean = NULL, sigma2 = 25),
    seed = seed
  )
  series
}
