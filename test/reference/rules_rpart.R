# Reference for the segment rules (CART, Breiman et al. 1984, Gini): R's rpart with
# method = "class", split = "gini", cp = 0, xval = 0, no competitor or surrogate splits, on open
# datasets R ships: iris (Fisher 1936), mtcars (Henderson & Velleman 1981), warpbreaks (Tippett
# 1950) and CO2 (Potvin, Lechowicz & Tardif 1990), esoph (Breslow & Day 1980). Per tree: every internal node (rpart numbering:
# root 1, children 2n and 2n + 1) with its variable and threshold (numeric) or the levels on each
# side (factor), and the leaf node of every row.
# Run: Rscript test/reference/rules_rpart.R
library(rpart)
num <- function(v) paste0("[", paste(sprintf("%.17g", v), collapse = ","), "]")
int <- function(v) paste0("[", paste(as.integer(v), collapse = ","), "]")
str <- function(v) if (length(v) == 0) "[]" else paste0("[", paste0('"', v, '"', collapse = ","), "]")
cases <- list(
  list(name = "iris", data = datasets::iris, formula = Species ~ ., depth = 2, minLeaf = 5),
  list(name = "iris", data = datasets::iris, formula = Species ~ ., depth = 3, minLeaf = 5),
  list(name = "iris", data = datasets::iris, formula = Species ~ ., depth = 4, minLeaf = 2),
  list(name = "mtcars", data = transform(datasets::mtcars, cyl = factor(cyl), gear = factor(gear), carb = factor(carb)),
       formula = cyl ~ mpg + disp + hp + drat + wt + qsec + gear + carb, depth = 3, minLeaf = 2),
  list(name = "warpbreaks", data = datasets::warpbreaks, formula = tension ~ breaks + wool, depth = 3, minLeaf = 3),
  list(name = "CO2", data = data.frame(datasets::CO2)[, c("Type", "Treatment", "conc", "uptake")],
       formula = Type ~ Treatment + conc + uptake, depth = 3, minLeaf = 4),
  list(name = "warpbreaks", data = datasets::warpbreaks, formula = wool ~ tension + breaks, depth = 3, minLeaf = 3),
  # Smoking, alcohol and oesophageal cancer (Breslow & Day 1980), groups as unordered factors so
  # that the tobacco groups split as levels, not as an order.
  list(name = "esoph", data = transform(datasets::esoph, agegp = factor(agegp, ordered = FALSE),
       alcgp = factor(alcgp, ordered = FALSE), tobgp = factor(tobgp, ordered = FALSE)),
       formula = agegp ~ alcgp + tobgp + ncases + ncontrols, depth = 3, minLeaf = 3)
)
out <- c()
for (cs in cases) {
  fit <- rpart(cs$formula, data = cs$data, method = "class", parms = list(split = "gini"),
    control = rpart.control(maxdepth = cs$depth, minbucket = cs$minLeaf, minsplit = 2 * cs$minLeaf,
      cp = 0, xval = 0, maxcompete = 0, maxsurrogate = 0))
  frame <- fit$frame
  nodes <- as.integer(rownames(frame))
  inner <- which(frame$var != "<leaf>")
  splits <- c()
  for (t in seq_along(inner)) {
    row <- fit$splits[t, ]
    var <- as.character(frame$var[inner[t]])
    if (row["ncat"] > 1) {
      lv <- levels(cs$data[[var]])
      side <- fit$csplit[row["index"], ]
      splits <- c(splits, sprintf('{"node":%d,"column":"%s","left":%s,"right":%s}', nodes[inner[t]], var,
        str(lv[side == 1]), str(lv[side == 3])))
    } else {
      splits <- c(splits, sprintf('{"node":%d,"column":"%s","threshold":%.17g}', nodes[inner[t]], var, row["index"]))
    }
  }
  target <- all.vars(cs$formula)[1]
  predictors <- attr(terms(cs$formula, data = cs$data), "term.labels")
  columns <- sapply(predictors, function(p) sprintf('{"name":"%s","values":%s}', p,
    if (is.factor(cs$data[[p]])) str(as.character(cs$data[[p]])) else num(cs$data[[p]])))
  out <- c(out, sprintf('{"dataset":"%s","depth":%d,"minLeaf":%d,"target":%s,"columns":[%s],"splits":[%s],"leafOfRow":%s}',
    cs$name, cs$depth, cs$minLeaf, str(as.character(cs$data[[target]])), paste(columns, collapse = ","),
    paste(splits, collapse = ","), int(nodes[fit$where])))
}
json <- sprintf('{"producedBy":"%s, rpart %s (method class, gini, cp 0, xval 0, maxcompete 0, maxsurrogate 0, minsplit = 2 minbucket)","trees":[%s]}',
  R.version.string, packageVersion("rpart"), paste(out, collapse = ","))
here <- dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE)))
writeLines(json, file.path(here, "fixtures", "rules_rpart.json"))
