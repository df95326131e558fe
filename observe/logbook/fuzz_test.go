package logbook

import (
	"bytes"
	"errors"
	"fmt"
	"testing"

	"example.org/vigil/internal/table"
)

// FuzzImportCSV feeds arbitrary bytes to the importer of every table (which
// picks the table) of a small logbook. An import must never panic; when it
// fails the error must be a *table.Error naming the file, and the logbook
// must be unchanged.
func FuzzImportCSV(f *testing.F) {
	for i, tb := range Tables {
		for _, s := range fuzzSeeds[tb] {
			f.Add([]byte(s), uint8(i))
		}
	}
	lb, _ := fixture(f)
	f.Fuzz(func(t *testing.T, data []byte, which uint8) {
		tb := Tables[int(which)%len(Tables)]
		before := counts(t, lb)
		n, err := lb.ImportCSV(tb, bytes.NewReader(data), "fuzz.csv")
		after := counts(t, lb)
		if err != nil {
			var te *table.Error
			if !errors.As(err, &te) || te.File != "fuzz.csv" {
				t.Fatalf("%s: error %T %q: want a *table.Error naming fuzz.csv", tb, err, err)
			}
			if fmt.Sprint(before) != fmt.Sprint(after) {
				t.Fatalf("%s: a failed import changed the logbook: %v → %v (%v)", tb, before, after, err)
			}
			return
		}
		if after["imports"] != before["imports"]+1 || n < 0 {
			t.Fatalf("%s: imported %d rows, imports %d → %d", tb, n, before["imports"], after["imports"])
		}
	})
}

// fuzzSeeds are a good and a few bad inputs for each table, against the
// fixture.
var fuzzSeeds = map[Table][]string{
	SitesTable: {
		goodSites + "Hill A,45,7,100,UTC,10,\"0/5; 180/25\"\n",
		goodSites + "Hill B,95,7,100,UTC,10,\n",
		goodSites + "\"Hill C,45,7\n",
	},
	TargetsTable: {
		"name,ra,dec,epoch,period,comps,mean_mag_v\nNew Star,05:30:00,+30,2459000.1,1.2,C1=11.2/0.6,9.3\n",
		"name,ra,dec,epoch,period\nNew Star,25,30,2459000.1,1.2\n",
	},
	EphemeridesTable: {
		"target,epoch,timescale,period,adopted,source\nTest Star A,2458000.1,hjd,1.19,2015-01-01T00:00:00Z,x\n",
		"target,epoch,timescale,period,adopted\nTest Star A,2458000.1,hjd,0,2015\n",
	},
	NightsTable: {
		"site,date,observer\nRidge Top,2025-06-01,me\n",
		"site,date\nRidge Top,2025-13-01\n",
	},
	PlansTable: {
		"site,date,target,note\nRidge Top,2025-03-14,Test Star A,first\n",
		"site,date,target\nRidge Top,2025-03-14,Nobody\n",
	},
	MeasurementsTable: {
		goodMeas + "Test Star A,Ridge Top,2025-03-14,2460749.4,-7.5,0.004,C1=-8.1/0.005; C2=-7.2,K1=-7.6/0.006,11.8,0.006\n",
		goodMeas + "Test Star A,Ridge Top,2025-03-14,2460749.4,-7.5,0.004,C1=-8.1/x,,,\n",
		goodMeas + "Test Star A,Ridge Top,2025-03-14,NaN,-7.5,,,,,\n",
	},
	TimingsTable: {
		goodTimings + "Test Star A,2460749.43,bjd,0.0005,min,true,own,kvw,,Ridge Top,2025-03-14\n",
		goodTimings + "Test Star A,2460749.43,hjd,,max,true,published,,,,\n",
	},
}
