using System;
using Microsoft.EntityFrameworkCore.Migrations;
using Npgsql.EntityFrameworkCore.PostgreSQL.Metadata;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.PostgreSQL
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
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    SaddleCalculationId = table.Column<int>(type: "integer", nullable: false),
                    UploadId = table.Column<int>(type: "integer", nullable: false),
                    Label = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: false, collation: "C"),
                    LevelOfTheory = table.Column<string>(type: "character varying(400)", maxLength: 400, nullable: false, collation: "C"),
                    Form = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    AtomCount = table.Column<int>(type: "integer", nullable: false),
                    AtomicNumbers = table.Column<byte[]>(type: "bytea", nullable: false),
                    SaddleFrame = table.Column<int>(type: "integer", nullable: true),
                    StoredFileId = table.Column<int>(type: "integer", nullable: true),
                    BackwardStoredFileId = table.Column<int>(type: "integer", nullable: true),
                    SourceSha256 = table.Column<string>(type: "character varying(64)", maxLength: 64, nullable: false, collation: "C"),
                    UploadedByUserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    UploadedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false),
                    Retired = table.Column<bool>(type: "boolean", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    Version = table.Column<long>(type: "bigint", nullable: false)
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
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    IrcId = table.Column<int>(type: "integer", nullable: false),
                    Index = table.Column<int>(type: "integer", nullable: false),
                    Role = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    PathLengthAngstrom = table.Column<double>(type: "double precision", nullable: true),
                    EnergyHartree = table.Column<double>(type: "double precision", nullable: true),
                    PositionsAngstrom = table.Column<byte[]>(type: "bytea", nullable: false)
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
