#!/usr/bin/python3
"""Exploration behind the combined rule's model choice (benchmarks/results/dimensions-study-2026-12-02.md, section
"The combined rule as boosted trees"). Not part of the tool. Run from the repository root with Debian's interpreter
(python3-numpy, python3-sklearn 1.2.1):
    /usr/bin/python3 benchmarks/ItemReduce.DimensionStudy/scripts/explore_combined.py
Part 1: five-fold cross-validation (survey i in fold i mod 5) of several models on the training tables only, with the
same allowed steps as at prediction time. Part 2: the three candidates that were then looked at on the grid.
"""
import csv
import warnings
import numpy as np
from sklearn.ensemble import GradientBoostingClassifier, HistGradientBoostingClassifier, RandomForestClassifier
from sklearn.linear_model import LogisticRegression
from sklearn.pipeline import make_pipeline
from sklearn.preprocessing import PolynomialFeatures, StandardScaler

warnings.filterwarnings("ignore")
D = "benchmarks/results/dimensions-study-2026-12-02/"
FEAT=["d_pca95","d_pca_mean","d_reduced_mean","d_cd","d_ekc","d_kaiser","d_map","ln_n","ln_p","ln_items_per_factor",
 "z_reduced_m","z_reduced_m1","z_reduced_m2","z_pca_m","z_pca_m1","z_pca_m2","ln_gap_m","cd_p_m1"]
RULES=['pa-pca-95','pa-pca-mean','pa-reduced-95','pa-reduced-mean','map','map-revised','kaiser','ekc','cd','hull','combined']
def load(name):
    r=list(csv.DictReader(open(D+name)))
    g=lambda k,t=float: np.array([t(x[k]) for x in r])
    d={k:g(k) for k in FEAT}
    for k in RULES+['factors','items_per_factor','respondents','cell']: d[k]=g(k,int)
    d['r']=g('factor_correlation')
    d['X']=np.column_stack([d[k] for k in FEAT])
    d['p']=d['factors']*d['items_per_factor']
    return d


def maxf(p):
    k = 1
    while k + 1 < p and (p - (k + 1)) ** 2 - (p + k + 1) > 0:
        k += 1
    return k


def allowed(m, p):
    steps = np.array([-2, -1, 0, 1, 2])
    lowest = max(min(1, m), m - 2)
    highest = 1 if m <= 1 else max(m, maxf(p))
    return np.array([(m + s >= lowest) and (s <= 0 or m + s <= highest) for s in steps])


def report(g,pred,name):
    t=g['factors']; hit=(pred==t)
    cells=np.unique(g['cell'])
    single=['pa-pca-95','pa-pca-mean','pa-reduced-95','pa-reduced-mean','map','map-revised','kaiser','ekc','cd','hull']
    bad=[];worst=1
    for c in cells:
        i=g['cell']==c; h=hit[i].mean(); worst=min(worst,h)
        best=max((g[s][i]==t[i]).mean() for s in single)
        if h<0.8-1e-9 and best>=0.8-1e-9: bad.append((int(g['factors'][i][0]),int(g['items_per_factor'][i][0]),float(g['r'][i][0]),int(g['respondents'][i][0]),round(h,2)))
    one=t==1
    byn={n:round(hit[g['respondents']==n].mean(),3) for n in (200,500,1000)}
    print(f"{name}: hit {hit.mean():.4f} byn {byn} worst {worst:.2f} bad {len(bad)} over1 {(pred[one]>1).mean():.3f} {bad}")
    return hit.mean(),len(bad)

STEPS=np.array([-2,-1,0,1,2])
def allowed_mat(d):
    return np.array([allowed(m,p) for m,p in zip(d['pa-reduced-95'],d['p'])])
def labels(d,A):
    step=d['factors']-d['pa-reduced-95']
    lab=[]
    for s,a in zip(step,A):
        c=[i for i in range(5) if a[i]]; lab.append(min(c,key=lambda i:abs(STEPS[i]-s)))
    return np.array(lab)
def decide(P,A,m):
    P=np.where(A,P,-np.inf); return m+STEPS[np.argmax(P,1)]
tr=[load('training-datasets.csv'),load('training-hard-datasets.csv')]
T={k:np.concatenate([t[k] for t in tr]) for k in tr[0] if k!='X'}; T['X']=np.vstack([t['X'] for t in tr])
G=load('grid-datasets.csv')
for d in (T,G): d['A']=allowed_mat(d); d['y']=labels(d,d['A'])
def cv(make, X, d=T, folds=5):
    n=len(X); pred=np.zeros(n,int)
    for f in range(folds):
        te=np.arange(n)%folds==f; tr_=~te
        mdl=make(); classes=np.unique(d['y'][tr_]); mdl.fit(X[tr_],d['y'][tr_])
        P=np.full((te.sum(),5),-1e9); P[:,classes]=np.log(mdl.predict_proba(X[te])+1e-300)
        pred[te]=decide(P,d['A'][te],d['pa-reduced-95'][te])
    return (pred==d['factors']).mean(), pred
def fitpred(make,Xt,Xg):
    mdl=make(); classes=np.unique(T['y']); mdl.fit(Xt,T['y'])
    P=np.full((len(Xg),5),-1e9); P[:,classes]=np.log(mdl.predict_proba(Xg)+1e-300)
    return decide(P,G['A'],G['pa-reduced-95']), mdl

if __name__ == "__main__":
    X = T["X"]
    print("reduced-matrix P95 alone on the training surveys", (T["pa-reduced-95"] == T["factors"]).mean())
    candidates = {}
    for C in [0.3, 1, 3, 10, 30]:
        candidates[f"logit C={C}"] = lambda C=C: make_pipeline(StandardScaler(), LogisticRegression(C=C, max_iter=5000))
    for C in [0.03, 0.1, 0.3]:
        candidates[f"logit+products C={C}"] = lambda C=C: make_pipeline(
            StandardScaler(), PolynomialFeatures(2), StandardScaler(), LogisticRegression(C=C, max_iter=5000))
    candidates["random forest"] = lambda: RandomForestClassifier(300, min_samples_leaf=3, random_state=0, n_jobs=1)
    for depth, ne, lr in [(2, 100, 0.1), (3, 100, 0.1), (3, 200, 0.05), (2, 300, 0.05), (3, 300, 0.05), (4, 100, 0.1)]:
        candidates[f"boosting depth {depth} {ne}x{lr}"] = lambda d=depth, n=ne, r=lr: GradientBoostingClassifier(
            n_estimators=n, max_depth=d, learning_rate=r, random_state=0)
    for lr, it in [(0.1, 100), (0.05, 300)]:
        candidates[f"histogram boosting {it}x{lr}"] = lambda r=lr, i=it: HistGradientBoostingClassifier(
            learning_rate=r, max_iter=i, max_depth=3, random_state=0)
    for name, make in candidates.items():
        print(f"cross-validated on training: {name}: {cv(make, X)[0]:.4f}")
    for name in ["histogram boosting 300x0.05", "boosting depth 3 300x0.05", "logit C=10"]:
        pred, _ = fitpred(candidates[name], T["X"], G["X"])
        report(G, pred, "grid: " + name)
