using System;
using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.Sqlite
{
    /// <inheritdoc />
    public partial class IrcPaths : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.CreateTable(
                name: "Ircs",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    SaddleCalculationId = table.Column<int>(type: "INTEGER", nullable: false),
                    UploadId = table.Column<int>(type: "INTEGER", nullable: false),
                    Label = table.Column<string>(type: "TEXT", maxLength: 200, nullable: false),
                    LevelOfTheory = table.Column<string>(type: "TEXT", maxLength: 400, nullable: false),
                    Form = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    AtomCount = table.Column<int>(type: "INTEGER", nullable: false),
                    AtomicNumbers = table.Column<byte[]>(type: "BLOB", nullable: false),
                    SaddleFrame = table.Column<int>(type: "INTEGER", nullable: true),
                    StoredFileId = table.Column<int>(type: "INTEGER", nullable: true),
                    BackwardStoredFileId = table.Column<int>(type: "INTEGER", nullable: true),
                    SourceSha256 = table.Column<string>(type: "TEXT", maxLength: 64, nullable: false),
                    UploadedByUserId = table.Column<string>(type: "TEXT", nullable: false),
                    UploadedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false),
                    Retired = table.Column<bool>(type: "INTEGER", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "TEXT", nullable: true),
                    Version = table.Column<long>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Ircs", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Ircs_Calculations_SaddleCalculationId",
                        column: x => x.SaddleCalculationId,
                        principalTable: "Calculations",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Ircs_StoredFiles_BackwardStoredFileId",
                        column: x => x.BackwardStoredFileId,
                        principalTable: "StoredFiles",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Ircs_StoredFiles_StoredFileId",
                        column: x => x.StoredFileId,
                        principalTable: "StoredFiles",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Ircs_Uploads_UploadId",
                        column: x => x.UploadId,
                        principalTable: "Uploads",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "IrcFrames",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    IrcId = table.Column<int>(type: "INTEGER", nullable: false),
                    Index = table.Column<int>(type: "INTEGER", nullable: false),
                    Role = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    PathLengthAngstrom = table.Column<double>(type: "REAL", nullable: true),
                    EnergyHartree = table.Column<double>(type: "REAL", nullable: true),
                    PositionsAngstrom = table.Column<byte[]>(type: "BLOB", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_IrcFrames", x => x.Id);
                    table.ForeignKey(
                        name: "FK_IrcFrames_Ircs_IrcId",
                        column: x => x.IrcId,
                        principalTable: "Ircs",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateIndex(
                name: "IX_IrcFrames_IrcId_Index",
                table: "IrcFrames",
                columns: new[] { "IrcId", "Index" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Ircs_BackwardStoredFileId",
                table: "Ircs",
                column: "BackwardStoredFileId");

            migrationBuilder.CreateIndex(
                name: "IX_Ircs_SaddleCalculationId",
                table: "Ircs",
                column: "SaddleCalculationId");

            migrationBuilder.CreateIndex(
                name: "IX_Ircs_StoredFileId",
                table: "Ircs",
                column: "StoredFileId");

            migrationBuilder.CreateIndex(
                name: "IX_Ircs_UploadId",
                table: "Ircs",
                column: "UploadId");
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropTable(
                name: "IrcFrames");

            migrationBuilder.DropTable(
                name: "Ircs");
        }
    }
}
